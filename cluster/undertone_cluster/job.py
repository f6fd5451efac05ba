"""The cluster job: count on the workers, merge, prune and weight as the index does, decompose
with Dask's randomized SVD, write the portable concept model.

Stages (each a set of named Dask tasks, visible in the scheduler's dashboard when bokeh is
installed; their progress is read from the scheduler's Progress plugin and printed on stderr,
progress.py):
  1. count-shard-N: each worker runs `undertone count` on its share of the files (contiguous runs
     of the sorted file list) and keeps the counts in memory. A task whose worker dies is run
     again elsewhere by the scheduler (Dask reschedules lost tasks; `retries` also re-runs a
     failed `undertone count`). Counted plus skipped files are checked against each share's list,
     and the union of the shares against the whole list: no file is dropped without a record.
  2. merge (client): vocabularies, document frequencies and total counts of the shards (exact:
     integers), pruning (weighting.prune).
  3. entropy-N (log-entropy only): the entropy sum per term, carried from shard to shard in file
     order (bit-exact with the index's single pass); global weights on the client.
  4. weigh-shard-N: the shard's weighted, unit-length rows as a scipy CSR block (kept on its
     worker): one row-chunk of the chunked sparse array (files x kept terms).
  5. dask.array.linalg.svd_compressed (Halko, Martinsson & Tropp 2011 as Dask implements it) with
     iterator="QR" (re-orthonormalised power iterations, like the index's), the index's number of
     power iterations, its oversampling, and a seed; or, with a tolerance, the same power steps
     until the top-k subspace settles (decompose below), so that any second run (another seed, or
     the local index with as many steps) holds the same subspace and ranks the same.
"""
import os
import sys
import time

import numpy as np
import scipy.sparse as sp

from . import weighting
from .progress import StageProgress
from .shards import Shard, count_share


class CsrBlock(sp.csr_matrix):
    """scipy CSR that accepts numpy's transpose(axes) call, as Dask's .T makes it."""

    def transpose(self, axes=None, copy=False):
        if axes is not None and tuple(axes) != (1, 0):
            raise ValueError("a 2-D block transposes only as (1, 0)")
        return CsrBlock(sp.csr_matrix.transpose(self, copy=copy).tocsr())


class JobError(RuntimeError):
    pass


def _stats(shard):
    return shard.stats()


def _columns_of(shard, mapping):
    """The shard's entries restricted to kept columns (global), with counts and row pointers."""
    cols = mapping[shard.cols]
    keep = cols >= 0
    rows = np.repeat(np.arange(len(shard.files)), np.diff(shard.indptr))[keep]
    indptr = np.concatenate([[0], np.cumsum(np.bincount(rows, minlength=len(shard.files)))]).astype(np.int64)
    return indptr, cols[keep].astype(np.int64), shard.counts[keep]


def _entropy_step(acc, shard, mapping, gf):
    _, cols, counts = _columns_of(shard, mapping)
    return weighting.entropy_partial(acc, cols, counts, gf)


def _weigh(shard, mapping, g, scheme, m):
    indptr, cols, counts = _columns_of(shard, mapping)
    ip, c, v = weighting.weigh_rows(indptr, cols, counts, g, scheme)
    return CsrBlock((v, c, ip), shape=(len(shard.files), m))


def _flip_signs(u_terms, v_files):
    """The index's sign rule: the largest-magnitude entry of each term vector is positive (first wins ties)."""
    best = np.argmax(np.abs(u_terms), axis=0)
    sign = np.where(u_terms[best, np.arange(u_terms.shape[1])] < 0, -1.0, 1.0)
    return u_terms * sign, v_files * sign


def note(msg):
    print(f"[undertone-cluster {time.strftime('%H:%M:%S')}] {msg}", file=sys.stderr, flush=True)


def run_job(client, *, folder, paths, undertone, work_dir, k="auto", scheme="log-entropy", prune=None,
            power_iterations=5, seed=20261201, shard_files=2000, retries=2, with_file_vectors=True,
            max_file_size=None, drill_kill_worker_after=None, tolerance=None, max_power_iterations=60):
    """Runs the whole job on a connected dask.distributed Client; returns a dict of results."""
    import dask
    import dask.array as da
    from distributed import as_completed, wait

    t0 = time.perf_counter()
    timings = {}
    paths = sorted(paths, key=weighting.code_unit_key)
    if len(set(paths)) != len(paths):
        raise JobError("the file list names a file twice")
    shares = [paths[i : i + shard_files] for i in range(0, len(paths), shard_files)]
    workers_at_start = len(client.scheduler_info()["workers"])
    note(f"{len(paths)} files in {len(shares)} shares of up to {shard_files}; workers: {workers_at_start}")
    folder = os.path.abspath(folder)

    # 1. Counting.
    futures = [
        client.submit(count_share, i, share, folder, undertone, work_dir, max_file_size,
                      key=f"count-shard-{i:05d}", retries=retries, pure=False)
        for i, share in enumerate(shares)
    ]
    counting = StageProgress(client, "count", futures)
    done = 0
    killed = False
    for fut in as_completed(futures):
        if fut.status == "error":
            i = futures.index(fut)
            err = fut.exception()
            if type(err).__name__ == "KilledWorker":
                raise JobError(f"counting stopped: shard {i} ({len(shares[i])} files from {shares[i][0]}) took down "
                               f"its worker every time it ran (the scheduler's allowed-failures); no model is written "
                               f"rather than one without those files")
            raise JobError(f"counting failed in shard {i} ({len(shares[i])} files from {shares[i][0]}) after "
                           f"{retries} retries: {err}")
        done += 1
        if drill_kill_worker_after is not None and done >= drill_kill_worker_after and not killed and done < len(futures):
            killed = _kill_one_worker(client, futures)
        if done % max(1, len(futures) // 10) == 0 or done == len(futures):
            note(f"counted {done}/{len(futures)} shares")
    counting.stop()
    attempts_log = os.path.join(work_dir, "attempts.log")
    tried = open(attempts_log, encoding="utf-8").read().split() if os.path.exists(attempts_log) else []
    attempts = len(tried) if tried else len(futures)
    again = sorted({int(i) for i in tried if tried.count(i) > 1})
    if again:
        note(f"{len(again)} share(s) counted again after a worker was lost or a count failed: "
             + ", ".join(f"{i} ({len(shares[i])} files from {shares[i][0]})" for i in again))
    stats = client.gather([client.submit(_stats, f, key=f"stats-{i:05d}", pure=False) for i, f in enumerate(futures)])
    timings["count"] = time.perf_counter() - t0

    # 2. Merge and prune.
    t1 = time.perf_counter()
    counted, skipped = [], []
    for st, share in zip(stats, shares):
        got = sorted(st["files"] + [s["path"] for s in st["skipped"]], key=weighting.code_unit_key)
        if got != share:
            raise JobError(f"shard {st['index']} did not account for every file it was given")
        counted += st["files"]
        skipped += st["skipped"]
    if counted != sorted(counted, key=weighting.code_unit_key):
        raise JobError("counted files are out of order")
    n = len(counted)
    if n == 0:
        raise JobError("no file could be counted")
    terms = weighting.merge_vocabularies(st["terms"] for st in stats)
    position = {t: i for i, t in enumerate(terms)}
    df = np.zeros(len(terms), dtype=np.int64)
    gf = np.zeros(len(terms))
    shard_global = []
    for st in stats:
        idx = np.fromiter((position[t] for t in st["terms"]), dtype=np.int64, count=len(st["terms"]))
        shard_global.append(idx)
        np.add.at(df, idx, st["df"])
        np.add.at(gf, idx, st["gf"])
    kept, relaxed = weighting.prune(terms, df, n, prune)
    m = len(kept)
    if m == 0:
        raise JobError("the files contain no indexable words")
    column = np.full(len(terms), -1, dtype=np.int64)
    column[kept] = np.arange(m)
    mappings = [client.scatter(column[idx], hash=False) for idx in shard_global]
    kept_terms = [terms[i] for i in kept]
    gf_kept = gf[kept]
    note(f"merged: {n} files counted, {len(skipped)} skipped, {len(terms)} terms, {m} kept after pruning")
    timings["merge"] = time.perf_counter() - t1

    # 3. Global weights.
    t2 = time.perf_counter()
    if scheme == "log-entropy":
        gf_f = client.scatter(gf_kept, broadcast=True, hash=False)
        acc = np.zeros(m)
        for i, f in enumerate(futures):
            acc = client.submit(_entropy_step, acc, f, mappings[i], gf_f, key=f"entropy-{i:05d}", pure=False)
        g = weighting.global_weights(scheme, n, None, acc.result())
    else:
        g = weighting.global_weights(scheme, n, df[kept])
    g_f = client.scatter(g, broadcast=True, hash=False)

    # 4. Weighted blocks: the chunked sparse array.
    blocks = [client.submit(_weigh, f, mappings[i], g_f, scheme, m, key=f"weigh-shard-{i:05d}", pure=False) for i, f in enumerate(futures)]
    weighing = StageProgress(client, "weigh", blocks)
    wait(blocks)
    weighing.stop()
    del futures
    rows = [len(st["files"]) for st in stats]
    arrays = [da.from_delayed(b, shape=(r, m), dtype=np.float64, meta=CsrBlock((0, m))) for b, r in zip(blocks, rows) if r > 0]
    x = da.concatenate(arrays, axis=0)
    nnz = sum(client.gather([client.submit(lambda b: b.nnz, b, pure=False) for b in blocks]))
    timings["weigh"] = time.perf_counter() - t2
    note(f"weighted matrix: {n} files x {m} terms, {nnz} non-zeros, {len(arrays)} row chunks")

    # 5. Randomized SVD.
    t3 = time.perf_counter()
    sent_before = sum(client.run(_bytes_sent).values())
    kk = weighting.choose_k(k, n, m)
    p = weighting.default_oversampling(kk)
    u, s, vt, steps, angles = decompose(client, x, kk, p, power_iterations=power_iterations, seed=seed,
                                        tolerance=tolerance, max_power_iterations=max_power_iterations)
    timings["svd"] = time.perf_counter() - t3
    svd_bytes = sum(client.run(_bytes_sent).values()) - sent_before
    peak_rss = client.run(_peak_rss)
    term_vectors, file_vectors = _flip_signs(vt.T, u)
    # Covered files as the index holds them: rows of V·Sigma scaled to unit length.
    file_vectors = file_vectors * s
    norms = np.linalg.norm(file_vectors, axis=1, keepdims=True)
    file_vectors = file_vectors / np.where(norms > 0, norms, 1.0)
    note(f"rank-{kk} SVD ({steps} power iterations, oversampling {p}) in {timings['svd']:.1f} s; "
         f"sigma_1 = {s[0]:.4f}, sigma_k = {s[-1]:.4f}")
    return {
        "files": counted, "skipped": skipped, "terms": kept_terms, "weights": g, "k": kk,
        "oversampling": p, "singular_values": s, "term_vectors": term_vectors,
        "file_vectors": file_vectors if with_file_vectors else None, "nonZeros": int(nnz),
        "relaxed": relaxed, "blocks": blocks, "rows": rows, "timings": timings,
        "frobeniusSquared": float(sum(client.gather([client.submit(lambda b: float(b.multiply(b).sum()), b, pure=False) for b in blocks]))),
        "killed_worker": killed, "workers": workers_at_start, "svd_bytes_sent": int(svd_bytes), "worker_peak_rss": [int(v) for v in peak_rss.values()], "count_attempts": attempts, "power_iterations": steps, "subspace_moves": angles, "shares": len(shares),
    }


def decompose(client, x, k, p, *, power_iterations, seed, tolerance=None, max_power_iterations=60):
    """Rank-k SVD of the chunked sparse array x (files x terms); returns (u, s, vt, iterations, angles).

    Without a tolerance: dask.array.linalg.svd_compressed (Halko, Martinsson & Tropp 2011, as Dask
    implements it) with iterator="QR" and `power_iterations` power steps.
    With a tolerance: the same steps as svd_compressed's (its Gaussian sketch from the same
    RandomState, each half step re-orthonormalised by Dask's tsqr, its final small SVD of Q^T X),
    but the power steps go on until the top-k subspace stops moving: after each step the Ritz
    vectors of the current basis (Halko et al. 2011, Algorithm 5.1 on the basis; Saad 2011,
    "Numerical Methods for Large Eigenvalue Problems", section 5.1, subspace iteration) are compared
    with the previous step's by the sine of their largest principal angle (Golub & Van Loan 2013,
    section 6.4.3; the section numbers of both books are cited from memory): it stops when that
    sine (computed as sqrt(1 - cos^2), so nothing below about 1e-7 is measurable) is below the
    tolerance (at least `power_iterations`
    steps, at most `max_power_iterations`). Subspace iteration brings the top-k subspace to the
    true one at the rate (sigma_{l+1} / sigma_k)^(2q), so a second run from another seed (or the
    index with as many steps) reaches the same subspace: the rankings then agree.
    """
    import dask
    import dask.array as da
    from dask.array.linalg import svd_compressed, tsqr
    from distributed import wait

    if tolerance is None:
        u, s, vt = svd_compressed(x, k, iterator="QR", n_power_iter=power_iterations, n_oversamples=p,
                                  seed=seed, compute=False, coerce_signs=False)
        u, s, vt = dask.compute(u, s, vt)
        return u, s, vt, power_iterations, []
    n, m = x.shape
    l = min(k + p, min(n, m))
    state = da.random.RandomState(seed)
    omega = state.standard_normal(size=(m, l), chunks=(x.chunks[1], (l,)))
    q, _ = tsqr(x.dot(omega))
    q, w = dask.persist(q, x.T.dot(q))  # w = X^T q (terms x l): the next half step's product, and the Ritz problem's
    wait([q, w])
    angles = []
    prev = None  # (q, top-k Ritz coefficients) of the previous step
    steps = 0
    while True:
        if prev is None:
            (g,) = dask.compute(w.T.dot(w))  # q^T X X^T q (l x l)
        else:
            g, cross = dask.compute(w.T.dot(w), prev[0].T.dot(q))  # and q_old^T q_new (l x l), one round trip
        lam, e = np.linalg.eigh(g)
        e_k = e[:, np.argsort(lam)[::-1][:k]]  # the top-k Ritz vectors are q e_k
        if prev is not None:
            cos = np.linalg.svd(prev[1].T @ cross @ e_k, compute_uv=False)  # cosines of the principal angles
            sine = float(np.sqrt(max(0.0, 1.0 - min(1.0, float(cos.min())) ** 2)))
            angles.append(sine)
            note(f"power step {steps}: the top-{k} subspace moved by sin {sine:.2e}")
            if steps >= power_iterations and sine < tolerance:
                break
        if steps >= max_power_iterations:
            last = f"{angles[-1]:.2e}" if angles else "unknown"
            raise JobError(f"the top-{k} subspace did not settle below {tolerance:g} in {max_power_iterations} power "
                           f"steps (last move {last}); raise --max-power-iterations or the tolerance")
        prev = (q, e_k)
        z, _ = tsqr(w)
        q, _ = tsqr(x.dot(z))
        q, w = dask.persist(q, x.T.dot(q))  # one round trip per power step, plus the small reductions
        wait([q, w])
        steps += 1
    # Final small SVD as svd_compressed computes it: (Q^T X)^T = X^T Q = V S U_b^T, U = Q U_b
    # (X^T Q for the final Q is w, already on the cluster).
    v, s, ub = tsqr(w, compute_svd=True)
    u = q.dot(ub.T)
    u, s, vt = dask.compute(u[:, :k], s[:k], v.T[:k, :])
    return u, s, vt, steps, angles


def _bytes_sent(dask_worker):
    """Bytes this worker has sent to other workers and the client so far."""
    return dask_worker.transfer_outgoing_bytes_total


def _peak_rss():
    """Peak resident memory of this worker process, bytes (Linux reports KiB)."""
    import resource

    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss * 1024


def _kill_one_worker(client, futures):
    """Drill: kill the process of a worker holding a finished count (its shard must be recounted)."""
    import signal

    who = client.who_has(futures)
    holders = [w[0] for w in who.values() if w]
    if not holders:
        return False
    victim = holders[0]
    pids = client.run(os.getpid, workers=[victim])
    pid = pids.get(victim)
    if pid is None:
        return False
    note(f"drill: killing worker {victim} (pid {pid}) that holds counted shards")
    os.kill(pid, signal.SIGKILL)
    return True
