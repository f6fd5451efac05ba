"""Writes the portable concept model file (layout: src/core/model/conceptFile.ts).

magic "UTCNCPT1" | u32 version | u32 header length | JSON header | zero pad to 8 |
sections at 8-byte offsets | u32 CRC-32 (zlib) of every byte before it. Little-endian.
"""
import json
import os
import zlib

import numpy as np

MAGIC = b"UTCNCPT1"
VERSION = 1


def _align8(n):
    return (n + 7) & ~7


def _names(items):
    return "".join(t + "\0" for t in items).encode("utf-8")


def write_model(path, *, terms, weights, singular_values, term_vectors, files, file_vectors, header_extra):
    k = len(singular_values)
    parts = [
        ("terms", "u8", np.frombuffer(_names(terms), dtype=np.uint8)),
        ("weights", "f64", np.ascontiguousarray(weights, dtype="<f8")),
        ("singularValues", "f64", np.ascontiguousarray(singular_values, dtype="<f8")),
        ("termVectors", "f32", np.ascontiguousarray(term_vectors, dtype="<f4").reshape(-1)),
    ]
    if files:
        parts.append(("files", "u8", np.frombuffer(_names(files), dtype=np.uint8)))
        parts.append(("fileVectors", "f32", np.ascontiguousarray(file_vectors, dtype="<f4").reshape(-1)))
    sections = []
    offset = 0
    for name, kind, arr in parts:
        sections.append({"name": name, "kind": kind, "offset": offset, "length": int(arr.size)})
        offset = _align8(offset + arr.nbytes)
    header = dict(header_extra)
    header.update({"format": "undertone-concept-model", "k": k, "terms": len(terms), "files": len(files), "sections": sections})
    hb = json.dumps(header, ensure_ascii=False, separators=(",", ":")).encode("utf-8")
    payload_at = _align8(16 + len(hb))
    buf = bytearray(payload_at + offset + 4)
    buf[0:8] = MAGIC
    buf[8:12] = VERSION.to_bytes(4, "little")
    buf[12:16] = len(hb).to_bytes(4, "little")
    buf[16 : 16 + len(hb)] = hb
    for (name, kind, arr), s in zip(parts, sections):
        start = payload_at + s["offset"]
        buf[start : start + arr.nbytes] = arr.tobytes()
    crc = zlib.crc32(memoryview(buf)[: len(buf) - 4]) & 0xFFFFFFFF
    buf[len(buf) - 4 :] = crc.to_bytes(4, "little")
    tmp = f"{path}.{os.getpid()}.tmp"
    with open(tmp, "wb") as f:
        f.write(buf)
    os.replace(tmp, path)
    return len(buf), crc
