"""python3 -m undertone_cluster FOLDER --out MODEL [options]: see cluster/README.md."""
import argparse
import json
import os
import shlex
import subprocess
import sys
import time
from datetime import datetime, timezone

import numpy as np

from . import weighting
from .job import JobError, note, run_job
from .model_file import write_model


def parse(argv):
    ap = argparse.ArgumentParser(prog="python3 -m undertone_cluster", description="Count and decompose a folder on a Dask cluster; write a portable concept model.")
    ap.add_argument("folder", help="the folder to index (the same path on every worker)")
    ap.add_argument("--out", required=True, help="the concept model file to write")
    ap.add_argument("--undertone", default="undertone", help='how workers run the command line, e.g. "node /opt/undertone/dist/cli.js"')
    ap.add_argument("--scheduler", help="address of a running Dask scheduler (tcp://host:8786); default: a local cluster")
    ap.add_argument("--dashboard-address", default=":8787", help="local cluster: where the scheduler's dashboard listens (default :8787; needs bokeh)")
    ap.add_argument("--local-workers", type=int, default=2, help="worker processes of the local cluster (default 2)")
    ap.add_argument("--files", help="the files to index, relative to FOLDER, one per line (default: `undertone count FOLDER --list`)")
    ap.add_argument("--shard-files", type=int, default=2000, help="files per counting shard (default 2000)")
    ap.add_argument("--k", default="auto", help="concept dimensions (default auto, as the index)")
    ap.add_argument("--weighting", default="log-entropy", choices=["log-entropy", "tfidf"])
    ap.add_argument("--power-iterations", type=int, default=5, help="plain power steps (default 5; the index reaches about that accuracy with 4 shifted ones)")
    ap.add_argument("--tolerance", type=float, help="go on with power iterations until the top-k subspace moves by less than this "
                    "(sine of the largest principal angle between two steps; e.g. 1e-4); default: exactly --power-iterations")
    ap.add_argument("--max-power-iterations", type=int, default=60, help="with --tolerance: stop with an error after this many (default 60)")
    ap.add_argument("--seed", type=int, default=20261201)
    ap.add_argument("--max-file-size", type=int, help="skip larger files (default: the index's, 1 MiB)")
    ap.add_argument("--retries", type=int, default=2, help="re-runs of a failed count task (default 2)")
    ap.add_argument("--no-file-vectors", action="store_true", help="leave V (one row per covered file) out of the model")
    ap.add_argument("--work-dir", help="where workers write shards (default: a folder beside --out)")
    ap.add_argument("--dump-matrix", help="also write the weighted matrix as DIR/matrix.mtx, terms.txt, files.txt (as `undertone export`)")
    ap.add_argument("--report", help="write timings and figures as JSON here")
    ap.add_argument("--drill-kill-worker-after", type=int, help="drill: kill one worker process after this many shards are counted (the job must recover)")
    a = ap.parse_args(argv)
    if a.tolerance is not None and not 1e-6 <= a.tolerance < 1:
        ap.error(f"--tolerance must be between 1e-6 and 1 (the sine of an angle, measured to about 1e-7), got {a.tolerance:g}")
    return a


def have_bokeh():
    try:
        import bokeh  # noqa: F401  (the dashboard needs it)
    except ImportError:
        return False
    return True


def main(argv=None):
    a = parse(argv if argv is not None else sys.argv[1:])
    from distributed import Client, LocalCluster

    out = os.path.abspath(a.out)
    work_dir = os.path.abspath(a.work_dir or out + ".shards")
    if os.path.exists(os.path.join(work_dir, "attempts.log")):
        os.remove(os.path.join(work_dir, "attempts.log"))
    if a.files:
        with open(a.files, encoding="utf-8") as f:
            paths = [line.rstrip("\r\n") for line in f if line.strip()]
    else:
        listed = subprocess.run(shlex.split(a.undertone) + ["count", a.folder, "--list"], capture_output=True, text=True)
        if listed.returncode != 0:
            print(f"undertone-cluster: listing the files failed: {listed.stderr.strip()}", file=sys.stderr)
            return 1
        paths = [p for p in listed.stdout.split("\n") if p]
    t0 = time.perf_counter()
    cluster = None
    if a.scheduler:
        client = Client(a.scheduler)
    else:
        cluster = LocalCluster(n_workers=a.local_workers, threads_per_worker=1, processes=True,
                               dashboard_address=a.dashboard_address if have_bokeh() else None)
        client = Client(cluster)
    if have_bokeh() or a.scheduler:
        note(f"dashboard: {client.dashboard_link} (needs bokeh on the scheduler)")
    else:
        note("no dashboard: bokeh is not installed (Debian 12 does not package it); "
             "progress below comes from the scheduler's progress feed")
    try:
        r = run_job(client, folder=a.folder, paths=paths, undertone=a.undertone, work_dir=work_dir, k=a.k,
                    scheme=a.weighting, power_iterations=a.power_iterations, seed=a.seed, shard_files=a.shard_files,
                    retries=a.retries, with_file_vectors=not a.no_file_vectors, max_file_size=a.max_file_size,
                    drill_kill_worker_after=a.drill_kill_worker_after,
                    tolerance=a.tolerance, max_power_iterations=a.max_power_iterations)
        if a.dump_matrix:
            dump_matrix(client, r, a.dump_matrix)
    except JobError as e:
        print(f"undertone-cluster: {e}", file=sys.stderr)
        return 1
    finally:
        client.close()
        if cluster is not None:
            cluster.close()
    size, crc = write_model(
        out, terms=r["terms"], weights=r["weights"], singular_values=r["singular_values"], term_vectors=r["term_vectors"],
        files=r["files"] if r["file_vectors"] is not None else [], file_vectors=r["file_vectors"],
        header_extra={
            "createdAt": datetime.now(timezone.utc).isoformat(), "producer": "undertone_cluster (Dask svd_compressed)",
            "weighting": a.weighting, "tokenize": {"stem": True, "keepCompounds": True}, "prune": weighting.DEFAULT_PRUNE,
            "powerIterations": r["power_iterations"], "oversampling": r["oversampling"], "seed": a.seed,
            "documents": len(r["files"]), "nonZeros": r["nonZeros"], "frobeniusSquared": r["frobeniusSquared"],
        })
    total = time.perf_counter() - t0
    note(f"wrote {out} ({size} bytes, CRC-32 {crc:08x}) in {total:.1f} s")
    if a.report:
        with open(a.report, "w", encoding="utf-8") as f:
            json.dump({"files": len(r["files"]), "skipped": len(r["skipped"]), "terms": len(r["terms"]), "k": r["k"],
                       "nonZeros": r["nonZeros"], "workers": r["workers"], "seconds": {**r["timings"], "total": total},
                       "singularValues": [float(x) for x in r["singular_values"]], "killedWorker": r["killed_worker"], "svdBytesSent": r["svd_bytes_sent"], "workerPeakRss": r["worker_peak_rss"], "oversampling": r["oversampling"], "nonZerosWeighted": r["nonZeros"], "countAttempts": r["count_attempts"], "powerIterations": r["power_iterations"], "subspaceMoves": r["subspace_moves"], "shares": r["shares"],
                       "modelBytes": size}, f)
    return 0


def dump_matrix(client, r, out_dir):
    """The weighted matrix as `undertone export` writes it: terms x files, 1-based, shortest exact decimals."""
    os.makedirs(out_dir, exist_ok=True)
    blocks = client.gather(r["blocks"])
    m = len(r["terms"])
    nnz = sum(b.nnz for b in blocks)
    with open(os.path.join(out_dir, "matrix.mtx"), "w", encoding="utf-8") as f:
        f.write("%%MatrixMarket matrix coordinate real general\n")
        f.write(f"{m} {len(r['files'])} {nnz}\n")
        col0 = 0
        for b in blocks:
            coo = b.tocoo()
            f.write("".join(f"{t + 1} {d + 1} {v!r}\n" for d, t, v in zip(coo.row + col0, coo.col, coo.data)))
            col0 += b.shape[0]
    with open(os.path.join(out_dir, "terms.txt"), "w", encoding="utf-8", newline="\n") as f:
        f.write("".join(t + "\n" for t in r["terms"]))
    with open(os.path.join(out_dir, "files.txt"), "w", encoding="utf-8", newline="\n") as f:
        f.write("".join(p + "\n" for p in r["files"]))
    with open(os.path.join(out_dir, "singular-values.txt"), "w", encoding="utf-8") as f:
        f.write("".join(repr(float(x)) + "\n" for x in r["singular_values"]))


if __name__ == "__main__":
    sys.exit(main())
