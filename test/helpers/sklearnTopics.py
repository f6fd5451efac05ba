#!/usr/bin/env python3
"""Reference figures for the topic evaluations (test/core/topics/topicQuality.test.ts), from
scikit-learn (Debian python3-sklearn). Reads one JSON file (argv[1]) and writes JSON to stdout.

Input: {"counts": {"rows", "cols", "indptr", "indices", "data"}  file × term counts,
        "vectors": [...], "dims": d                                the files' unit concept vectors,
        "folders": [...]                                          the folder label of each file,
        "levels": [{"k": K, "ours": [...]}]                       our topic label of each file,
        "topTerms": N, "seed": s}
Output: {"levels": [{"k", "nmfTop": [[col, ...], ...], "kmeansNmi", "oursNmi"}], "version"}

NMF as in scikit-learn's own topic-extraction example: TF-IDF of the counts (sublinear tf,
terms in at least 2 files and at most 95% of them), NMF with NNDSVD start, Frobenius loss.
k-means: KMeans(n_clusters=K, n_init=10) on the same concept vectors. NMI: the arithmetic-mean
normalisation (scikit-learn's default).
"""
import json, sys

import numpy as np
import scipy.sparse as sp
import sklearn
from sklearn.cluster import KMeans
from sklearn.decomposition import NMF
from sklearn.feature_extraction.text import TfidfTransformer
from sklearn.metrics import normalized_mutual_info_score


def main():
    with open(sys.argv[1], encoding='utf-8') as fh:
        q = json.load(fh)
    c = q['counts']
    counts = sp.csr_matrix((np.array(c['data'], dtype=np.float64), np.array(c['indices']), np.array(c['indptr'])), shape=(c['rows'], c['cols']))
    df = np.asarray((counts > 0).sum(axis=0)).ravel()
    keep = np.flatnonzero((df >= 2) & (df <= 0.95 * counts.shape[0]) & np.array(q.get('nameable', [True] * counts.shape[1])))
    tfidf = TfidfTransformer(sublinear_tf=True).fit_transform(counts[:, keep])
    vectors = np.array(q['vectors'], dtype=np.float64).reshape(-1, q['dims'])
    folders = q['folders']
    out = []
    for level in q['levels']:
        k = level['k']
        nmf = NMF(n_components=k, init='nndsvd', random_state=q['seed'], max_iter=400).fit(tfidf)
        top = [[int(keep[j]) for j in np.argsort(-row)[: q['topTerms']]] for row in nmf.components_]
        km = KMeans(n_clusters=k, n_init=10, random_state=q['seed']).fit(vectors)
        out.append({
            'k': k,
            'nmfTop': top,
            'kmeansNmi': float(normalized_mutual_info_score(folders, km.labels_)),
            'oursNmi': float(normalized_mutual_info_score(folders, level['ours'])),
        })
    json.dump({'levels': out, 'version': sklearn.__version__}, sys.stdout)


if __name__ == '__main__':
    main()
