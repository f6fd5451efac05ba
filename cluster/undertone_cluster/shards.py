"""One share of the files: counted on a worker by `undertone count`, kept there in memory.

The shard files are the open format `undertone count` writes (src/cli/commands/countCommand.ts):
SHARD.mtx (Matrix Market, files x terms, integer counts), SHARD.terms, SHARD.files, SHARD.json.
"""
import json
import os
import shlex
import subprocess

import numpy as np


class CountFailed(RuntimeError):
    """`undertone count` failed on a worker (its message included)."""


class Shard:
    """Counts of one share: files in order, terms in code-unit order, CSR counts (files x terms)."""

    def __init__(self, index, files, skipped, terms, indptr, cols, counts, listed):
        self.index = index
        self.files = files
        self.skipped = skipped
        self.terms = terms
        self.indptr = indptr
        self.cols = cols
        self.counts = counts
        self.listed = listed

    def stats(self):
        """What the merge needs: terms, document frequency and total count per term, the files."""
        df = np.bincount(self.cols, minlength=len(self.terms)).astype(np.int64)
        gf = np.bincount(self.cols, weights=self.counts, minlength=len(self.terms))
        return {"index": self.index, "terms": self.terms, "df": df, "gf": gf, "files": self.files, "skipped": self.skipped, "listed": self.listed}


def read_lines(path):
    with open(path, encoding="utf-8", newline="\n") as f:
        text = f.read()
    lines = text.split("\n")
    if lines and lines[-1] == "":
        lines.pop()
    return lines


def read_shard(prefix, index):
    with open(prefix + ".json", encoding="utf-8") as f:
        manifest = json.load(f)
    if manifest.get("format") != "undertone-count-shard" or manifest.get("version") != 1:
        raise CountFailed(f"{prefix}.json is not a version-1 count shard")
    files = read_lines(prefix + ".files")
    terms = read_lines(prefix + ".terms")
    with open(prefix + ".mtx", "rb") as f:
        data = f.read()
    lines = data.split(b"\n")
    at = 0
    while lines[at].startswith(b"%"):
        at += 1
    rows, ncols, nnz = (int(x) for x in lines[at].split())
    body = b" ".join(lines[at + 1 :])
    nums = np.array(body.split(), dtype=np.int64) if nnz else np.zeros(0, dtype=np.int64)
    if nums.size != 3 * nnz or rows != len(files) or ncols != len(terms):
        raise CountFailed(f"{prefix}.mtx does not match its .files/.terms (damaged shard)")
    r = nums[0::3] - 1
    c = nums[1::3] - 1
    v = nums[2::3].astype(np.float64)
    if nnz and (np.any(np.diff(r) < 0)):
        raise CountFailed(f"{prefix}.mtx rows are not in order")
    indptr = np.concatenate([[0], np.cumsum(np.bincount(r, minlength=rows))]).astype(np.int64)
    listed = manifest["listed"]
    if manifest["counted"] + len(manifest["skipped"]) != listed or manifest["counted"] != len(files):
        raise CountFailed(f"{prefix}.json: counted + skipped files do not add up to the listed files")
    return Shard(index, files, manifest["skipped"], terms, indptr, c.astype(np.int32), v, listed)


def count_share(index, paths, folder, undertone, work_dir, max_file_size=None):
    """Runs `undertone count` for one share on this worker and loads its shard."""
    os.makedirs(work_dir, exist_ok=True)
    # One line per attempt (the job reports how many shards were counted again after a failure).
    with open(os.path.join(work_dir, "attempts.log"), "a", encoding="utf-8") as f:
        f.write(f"{index}\n")
    prefix = os.path.join(work_dir, f"shard-{index:05d}")
    list_path = prefix + ".list"
    with open(list_path, "w", encoding="utf-8", newline="\n") as f:
        f.write("".join(p + "\n" for p in paths))
    cmd = shlex.split(undertone) + ["count", folder, "--files", list_path, "--out", prefix, "--quiet"]
    if max_file_size:
        cmd += ["--max-file-size", str(max_file_size)]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        raise CountFailed(f"shard {index}: `{' '.join(cmd)}` exited with {done.returncode}: {done.stderr.strip()[-2000:]}")
    shard = read_shard(prefix, index)
    if shard.files + [s["path"] for s in shard.skipped] and sorted(shard.files + [s["path"] for s in shard.skipped]) != sorted(paths):
        raise CountFailed(f"shard {index}: the counted and skipped files are not the files it was given")
    for ext in (".mtx", ".terms", ".files", ".json", ".list"):
        try:
            os.remove(prefix + ext)
        except OSError:
            pass
    return shard
