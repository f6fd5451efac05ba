"""Merging shard counts, pruning and weighting exactly as the index does.

The rules are those of src/core/weighting/prune.ts (keep a term in at least minDocs files and at
most floor(maxDocFraction * n) of them; if that keeps nothing, keep every term; then the maxTerms
most frequent, ties by term order) and src/core/weighting/termWeighting.ts (log-entropy after
Dumais 1991, or smoothed tf-idf as scikit-learn's TfidfVectorizer(sublinear_tf=True); each file's
vector scaled to unit length). Every floating-point step is the index's, in the index's order:
  - the logarithms are fdlibm's (fdlibm.py), as node computes them;
  - sums that depend on order (the entropy sum per term over files, the squared norm per file over
    terms) are accumulated one value at a time in file order and term order (np.add.at adds in
    index order; the entropy sum is carried from shard to shard in file order);
so the weighted matrix equals the index's bit for bit (the test compares every entry).
"""
import numpy as np

from . import fdlibm

DEFAULT_PRUNE = {"minDocs": 2, "maxDocFraction": 0.5, "maxTerms": 100000}


def code_unit_key(s):
    """Sort key giving JavaScript's string order (UTF-16 code units)."""
    return s.encode("utf-16-be")


def merge_vocabularies(shard_terms):
    """Sorted union of the shards' term lists (each already in code-unit order)."""
    union = set()
    for terms in shard_terms:
        union.update(terms)
    return sorted(union, key=code_unit_key)


def prune(terms, df, n, options=None):
    """Kept term indices (ascending), as pruneVocabulary does; df indexed like terms."""
    o = dict(DEFAULT_PRUNE)
    o.update(options or {})
    max_docs = int(np.floor(o["maxDocFraction"] * n))
    ids = np.nonzero((df >= o["minDocs"]) & (df <= max_docs))[0]
    relaxed = False
    if ids.size == 0:
        relaxed = True
        ids = np.nonzero((df >= 1) & (df <= n))[0]
    if ids.size > o["maxTerms"]:
        # Most frequent first, ties by term order (terms are in code-unit order: id order).
        order = np.lexsort((ids, -df[ids]))
        ids = np.sort(ids[order[: o["maxTerms"]]])
    return ids.astype(np.int64), relaxed


def entropy_partial(acc, block_cols, block_counts, gf):
    """Adds p log p of one shard's entries to acc (kept columns), in file then term order."""
    acc = acc.copy()
    if block_cols.size:
        p = block_counts / gf[block_cols]
        np.add.at(acc, block_cols, p * fdlibm.log(p))
    return acc


def global_weights(scheme, n, df_kept, plogp=None):
    if scheme == "tfidf":
        return fdlibm.log((1.0 + n) / (1.0 + df_kept.astype(np.float64))) + 1.0
    denom = fdlibm.log(np.array([n + 1.0]))[0]
    return 1.0 + plogp / denom


def local_weights(counts, scheme):
    """log(1 + tf) (log-entropy) or 1 + ln tf (tf-idf), through a table of distinct counts."""
    uniq, inv = np.unique(counts, return_inverse=True)
    table = fdlibm.log1p(uniq) if scheme == "log-entropy" else 1.0 + fdlibm.log(uniq)
    return table[inv]


def weigh_rows(indptr, cols, counts, g, scheme):
    """Weighted, unit-length rows (CSR over kept columns, entries in column order per row).

    Entries whose weight is exactly 0 are dropped, as weightDocument does.
    Returns (indptr, cols, values, sum of squares).
    """
    rows = np.repeat(np.arange(len(indptr) - 1), np.diff(indptr))
    w = local_weights(counts, scheme) * g[cols]
    keep = w != 0
    if not np.all(keep):
        rows, cols, w = rows[keep], cols[keep], w[keep]
        indptr = np.concatenate([[0], np.cumsum(np.bincount(rows, minlength=len(indptr) - 1))])
    ss = np.zeros(len(indptr) - 1)
    np.add.at(ss, rows, w * w)
    norm = np.sqrt(ss)
    values = w / np.where(norm[rows] > 0, norm[rows], 1.0)
    # Frobenius contribution summed row by row, entry by entry (as the index does).
    return indptr.astype(np.int64), cols.astype(np.int32), values


def auto_k(files):
    """chooseK's automatic rule (src/core/svd/chooseK.ts), with JavaScript's Math.round."""
    if files >= 1000:
        return int(np.floor(min(300.0, max(100.0, 100 + 100 * np.log10(files / 1000))) + 0.5))
    return int(min(100, max(2, np.floor(files / 10 + 2 * np.sqrt(files) + 0.5))))


def choose_k(requested, files, terms):
    want = auto_k(files) if requested == "auto" else max(1, int(requested))
    return min(want, max(1, min(files, terms)))


def default_oversampling(k):
    """The index's oversampling (src/core/svd/randomizedSvd.ts)."""
    return max(10, -(-k // 2), min(k, 100))
