"""Products over the matrix needed for all k singular values within 1% of an exact solver:
randomized subspace iteration (Halko, Martinsson & Tropp 2011, Alg. 4.4 + 5.1: what
src/core/svd/randomizedSvd.ts does) against randomized block Krylov iteration (Musco & Musco
2015, "Randomized block Krylov methods for stronger and faster approximate singular value
decomposition", NeurIPS, Alg. 2), both in numpy/scipy, on a matrix exported by
`undertone export <folder> --format mtx --out DIR`. The exact values come from scipy's ARPACK
(svds). A "product" is one matrix-vector product with A or Aᵀ (a block of b columns counts b).
Both methods end with the same Rayleigh-Ritz step (singular values of AᵀQ for the final basis Q).

usage: python3 bench/compare/krylovVsSubspace.py DIR/matrix.mtx --k 200 \
           [--subspace 300,5 ...] [--krylov 200,3 ...]
  --subspace l,q   l sketch columns, q power iterations
  --krylov b,q     block size b, q iterations (Krylov basis of b(q+1) columns)
"""
import argparse
import json
import time

import numpy as np
import scipy.io
import scipy.sparse.linalg as sla


def main():
    p = argparse.ArgumentParser()
    p.add_argument("mtx")
    p.add_argument("--k", type=int, default=200)
    p.add_argument("--subspace", nargs="*", default=[])
    p.add_argument("--krylov", nargs="*", default=[])
    p.add_argument("--seed", type=int, default=0)
    args = p.parse_args()
    m = scipy.io.mmread(args.mtx).tocsr().astype(np.float64)
    a = m.T.tocsr() if m.shape[0] > m.shape[1] else m  # rows: the smaller side, as randomizedSvd.ts
    at = a.T.tocsr()
    k = args.k
    t0 = time.time()
    exact = np.sort(sla.svds(a, k=k, return_singular_vectors=False, random_state=0))[::-1]
    print(f"matrix {m.shape[0]} x {m.shape[1]}, {m.nnz} non-zeros; ARPACK {time.time() - t0:.1f} s", flush=True)

    def worst(z):
        s = np.linalg.svd(z, compute_uv=False)[:k]
        rel = np.abs(s - exact) / exact
        return float(rel.max()), int(rel.argmax()) + 1

    def subspace(l, q, rng):
        y = a @ rng.standard_normal((a.shape[1], l))
        prods = l
        qb, _ = np.linalg.qr(y)
        for _ in range(q):
            qb, _ = np.linalg.qr(a @ (at @ qb))
            prods += 2 * l
        return at @ qb, prods + l

    def krylov(b, q, rng):
        blk, _ = np.linalg.qr(a @ rng.standard_normal((a.shape[1], b)))
        prods = b
        blocks = [blk]
        for _ in range(q):
            y = a @ (at @ blocks[-1])
            prods += 2 * b
            basis = np.hstack(blocks)
            for _twice in range(2):  # block Gram-Schmidt against the basis so far, twice
                y -= basis @ (basis.T @ y)
            blk, _ = np.linalg.qr(y)
            blocks.append(blk)
        basis = np.hstack(blocks)
        return at @ basis, prods + basis.shape[1]

    for kind, specs, run in (("subspace", args.subspace, subspace), ("krylov", args.krylov, krylov)):
        for spec in specs:
            x, q = (int(v) for v in spec.split(","))
            t = time.time()
            z, prods = run(x, q, np.random.default_rng(args.seed))
            w, at_index = worst(z)
            print(
                json.dumps(
                    {"method": kind, "columns": x, "q": q, "basis": z.shape[1], "products": prods + k,
                     "worstPercent": round(100 * w, 3), "worstIndex": at_index, "seconds": round(time.time() - t, 1)}
                ),
                flush=True,
            )


if __name__ == "__main__":
    main()
