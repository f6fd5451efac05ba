#!/usr/bin/env python3
"""Reference figures for the topic evaluations (test/core/topics/topicQuality.test.ts), from
scikit-learn (Debian python3-sklearn). Reads one JSON file (argv[1]) and writes JSON to stdout.

Input: {"counts": {"rows", "cols", "indptr", "indices", "data"}  file × term counts,
        "nameable": [...]                                         columns NMF may name a topic by,
        "nmfK": [K, ...]                                           NMF component counts (one per level),
        "topTerms": N, "seed": s,
        optional, for the agreement with folders:
        "vectors": [...], "dims": d                                the files' unit concept vectors,
        "folders": [...]                                          the folder label of each file,
        "levels": [{"ks": [K, ...], "ours": [[...], ...],         per seed: our topic count and each file's label
                    "loose": [...],                                optional: 1 for a file our first seed's run sets apart
                    "bisecting": true}]                            optional: also scikit-learn's divisive tree at each count
        "seeds": [s, ...]}                                         the seeds (k-means' random_state)
Output: {"nmfTop": [[[col, ...], ...], ...], "levels": [{"kmeansNmi": [...], "oursNmi": [...],
         "looseOwn", "looseDropped", "kmeansDropped": [...], "bisectingNmi": [...]}], "version"}

NMF as in scikit-learn's own topic-extraction example: TF-IDF of the counts (sublinear tf,
terms in at least 2 files and at most 95% of them), NMF with NNDSVD start, Frobenius loss.
k-means: KMeans(n_clusters=K, n_init=10, random_state=seed) on the same concept vectors, for each
seed with the number of topics our tree has at that level with that seed. With "bisecting": a tree
from the same library at the same count, BisectingKMeans(n_clusters=K, random_state=seed) with its
defaults (divisive k-means, Steinbach, Karypis & Kumar 2000: the cluster of largest inertia is
split in two until K clusters; scikit-learn 1.1 and later). NMI: the
arithmetic-mean normalisation (scikit-learn's default). With "loose": our labels with the files
set apart as one more cluster (looseOwn), and both sides scored on the files we keep in a topic
(looseDropped against kmeansDropped).
"""
import json, sys

import numpy as np
import scipy.sparse as sp
import sklearn
from sklearn.cluster import BisectingKMeans, KMeans
from sklearn.decomposition import NMF
from sklearn.feature_extraction.text import TfidfTransformer
from sklearn.metrics import normalized_mutual_info_score as nmi


def main():
    with open(sys.argv[1], encoding='utf-8') as fh:
        q = json.load(fh)
    c = q['counts']
    counts = sp.csr_matrix((np.array(c['data'], dtype=np.float64), np.array(c['indices']), np.array(c['indptr'])), shape=(c['rows'], c['cols']))
    df = np.asarray((counts > 0).sum(axis=0)).ravel()
    keep = np.flatnonzero((df >= 2) & (df <= 0.95 * counts.shape[0]) & np.array(q.get('nameable', [True] * counts.shape[1])))
    tfidf = TfidfTransformer(sublinear_tf=True).fit_transform(counts[:, keep])
    nmf_top = []
    for k in q['nmfK']:
        nmf = NMF(n_components=k, init='nndsvd', random_state=q['seed'], max_iter=400).fit(tfidf)
        nmf_top.append([[int(keep[j]) for j in np.argsort(-row)[: q['topTerms']]] for row in nmf.components_])
    out = []
    if 'levels' in q:
        vectors = np.array(q['vectors'], dtype=np.float64).reshape(-1, q['dims'])
        folders = np.array(q['folders'])
        for level in q['levels']:
            km = [KMeans(n_clusters=k, n_init=10, random_state=s).fit(vectors).labels_ for s, k in zip(q['seeds'], level['ks'])]
            fig = {
                'kmeansNmi': [float(nmi(folders, labels)) for labels in km],
                'oursNmi': [float(nmi(folders, ours)) for ours in level['ours']],
            }
            if level.get('bisecting'):
                fig['bisectingNmi'] = [
                    float(nmi(folders, BisectingKMeans(n_clusters=k, random_state=s).fit(vectors).labels_)) for s, k in zip(q['seeds'], level['ks'])
                ]
            if 'loose' in level:
                loose = np.array(level['loose']) == 1
                first = np.array(level['ours'][0])
                fig['looseOwn'] = float(nmi(folders, np.where(loose, -1, first)))
                fig['looseDropped'] = float(nmi(folders[~loose], first[~loose]))
                fig['kmeansDropped'] = [float(nmi(folders[~loose], labels[~loose])) for labels in km]
            out.append(fig)
    json.dump({'nmfTop': nmf_top, 'levels': out, 'version': sklearn.__version__}, sys.stdout)


if __name__ == '__main__':
    main()
