"""k nearest documents by scikit-learn, for test/measures-corpus-neighbors.test.ts.

Reads JSON from stdin: {"docs": [[token, ...], ...], "stop": [token, ...], "queries": [i, ...], "k": 10}
and prints {"neighbors": [[j, ...], ...], "similarities": [[s, ...], ...]} for each query: its k
nearest other documents by cosine over TfidfVectorizer's defaults (smooth idf, raw tf, l2) on the
given tokens with the stop tokens left out, brute force, the query itself excluded.
Source: scikit-learn (Debian python3-sklearn) — TfidfVectorizer, NearestNeighbors.
"""
import json
import sys

from sklearn.feature_extraction.text import TfidfVectorizer
from sklearn.neighbors import NearestNeighbors


def main():
    job = json.load(sys.stdin)
    stop = set(job["stop"])
    docs = [[t for t in d if t not in stop] for d in job["docs"]]
    x = TfidfVectorizer(analyzer=lambda d: d).fit_transform(docs)
    k = job["k"]
    nn = NearestNeighbors(n_neighbors=k + 1, metric="cosine", algorithm="brute").fit(x)
    dist, idx = nn.kneighbors(x[job["queries"]])
    neighbors, sims = [], []
    for q, row, drow in zip(job["queries"], idx, dist):
        pairs = [(int(j), 1.0 - float(dj)) for j, dj in zip(row, drow) if j != q][:k]
        neighbors.append([j for j, _ in pairs])
        sims.append([s for _, s in pairs])
    json.dump({"neighbors": neighbors, "similarities": sims}, sys.stdout)


if __name__ == "__main__":
    main()
