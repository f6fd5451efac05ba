"""Reference pipeline for `npm run bench:compare` (a benchmark, not part of Undertone).

What a practitioner would script with Debian's scikit-learn: the same files Undertone indexes,
TfidfVectorizer(input='filename', sublinear_tf=True, min_df=2, max_df=0.5) and
TruncatedSVD(algorithm='randomized', n_iter=5, n_oversamples=10) at the same k. With
--in-memory the files are read into a list first (faster, more memory); with --letters-first
the token pattern keeps words that start with a letter (no numbers, no leading underscores),
which is faster than scikit-learn's default pattern and closer to what Undertone indexes.
`--in-memory --letters-first` is the fastest reasonable configuration, the one to beat.
Prints one JSON object on stdout: seconds per stage, peak RSS, matrix shape, singular values.

Usage:
  reference.py pipeline --files LIST --k K [--seed S] [--in-memory] [--letters-first]
      LIST holds one absolute path per line (the files Undertone's scan kept).
  reference.py arpack --mtx A.mtx --k K [--ours S.txt]
      Exact leading singular values of a Matrix Market matrix with scipy's ARPACK (svds),
      compared with ours (one value per line) when --ours is given.
"""
import argparse
import json
import os
import resource
import sys
import time


def peak_rss_bytes():
    # Linux reports ru_maxrss in KiB.
    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss * 1024


# A letter, then word characters: two characters or more, as scikit-learn's default asks.
LETTERS_FIRST = r"(?u)\b[^\W\d_]\w+\b"


def pipeline(args):
    import numpy as np
    from sklearn.feature_extraction.text import TfidfVectorizer
    from sklearn.decomposition import TruncatedSVD

    with open(args.files, encoding="utf-8") as f:
        paths = [line.rstrip("\n") for line in f if line.strip()]
    t0 = time.perf_counter()
    nbytes = 0
    if args.in_memory:
        # Read every file first (a separate "read" stage), then vectorise the texts.
        texts = []
        for p in paths:
            with open(p, "rb") as fh:
                raw = fh.read()
            nbytes += len(raw)
            texts.append(raw.decode("utf-8", errors="replace"))
        docs, source = texts, "content"
    else:
        # The vectoriser opens each file itself (input='filename'): no list of all texts in memory.
        for p in paths:
            nbytes += os.path.getsize(p)
        docs, source = paths, "filename"
    t1 = time.perf_counter()
    pattern = LETTERS_FIRST if args.letters_first else r"(?u)\b\w\w+\b"  # the latter is scikit-learn's default
    vec = TfidfVectorizer(
        input=source, decode_error="replace", sublinear_tf=True, min_df=2, max_df=0.5, dtype=np.float64, token_pattern=pattern
    )
    x = vec.fit_transform(docs)
    del docs
    t2 = time.perf_counter()
    k = min(args.k, min(x.shape) - 1)
    svd = TruncatedSVD(n_components=k, algorithm="randomized", n_iter=5, n_oversamples=10, random_state=args.seed)
    svd.fit_transform(x)
    t3 = time.perf_counter()
    json.dump(
        {
            "files": len(paths),
            "bytes": nbytes,
            "docs": x.shape[0],
            "terms": x.shape[1],
            "nnz": int(x.nnz),
            "k": k,
            "seconds": {"read": t1 - t0, "vectorize": t2 - t1, "svd": t3 - t2},
            "total": t3 - t0,
            "cpuSeconds": sum(resource.getrusage(resource.RUSAGE_SELF)[:2]),
            "peakRss": peak_rss_bytes(),
            "singularValues": [float(v) for v in svd.singular_values_],
        },
        sys.stdout,
    )
    sys.stdout.write("\n")


def arpack(args):
    import numpy as np
    import scipy.io
    from scipy.sparse.linalg import svds

    t0 = time.perf_counter()
    a = scipy.io.mmread(args.mtx).tocsr().astype(np.float64)
    t1 = time.perf_counter()
    k = min(args.k, min(a.shape) - 1)
    s = svds(a, k=k, solver="arpack", return_singular_vectors=False, random_state=0)
    s = np.sort(s)[::-1]
    t2 = time.perf_counter()
    out = {"shape": list(a.shape), "nnz": int(a.nnz), "k": k, "seconds": {"read": t1 - t0, "svds": t2 - t1}, "exact": [float(v) for v in s]}
    if args.ours:
        with open(args.ours, encoding="utf-8") as f:
            ours = np.array([float(line) for line in f if line.strip()])
        n = min(len(ours), k)
        # Relative to σ_i, but never below 1e-9·σ_1: on a rank-deficient matrix exact zeros
        # (duplicate files) are rounding noise on both sides, not a relative error.
        rel = np.abs(ours[:n] - s[:n]) / np.maximum(s[:n], 1e-9 * s[0])
        out["maxRelError"] = float(rel.max())
        out["meanRelError"] = float(rel.mean())
        out["worstIndex"] = int(rel.argmax())
    out["peakRss"] = peak_rss_bytes()
    json.dump(out, sys.stdout)
    sys.stdout.write("\n")


def main():
    ap = argparse.ArgumentParser()
    sub = ap.add_subparsers(dest="cmd", required=True)
    p = sub.add_parser("pipeline")
    p.add_argument("--files", required=True)
    p.add_argument("--k", type=int, required=True)
    p.add_argument("--seed", type=int, default=0)
    p.add_argument("--in-memory", action="store_true", help="read all files into memory before vectorising")
    p.add_argument("--letters-first", action="store_true", help="tokens start with a letter (see LETTERS_FIRST)")
    a = sub.add_parser("arpack")
    a.add_argument("--mtx", required=True)
    a.add_argument("--k", type=int, required=True)
    a.add_argument("--ours")
    args = ap.parse_args()
    pipeline(args) if args.cmd == "pipeline" else arpack(args)


if __name__ == "__main__":
    main()
