"""Leave-one-out k-NN precision@k with scikit-learn, the way a practitioner's notebook measures it.

Reads JSON from stdin: {"texts": [...], "labels": [...], "k": 10,
"stop_lists": {"name": null | "english" | [terms...] | {"max_df": 0.5}}} and prints
{"name": precision, ...}.
TfidfVectorizer with its defaults (its own tokenizer, smooth idf, l2) apart from the stop list or
max_df given, cosine distance, brute-force neighbours, the document itself excluded.
Source: scikit-learn (Debian python3-sklearn) — TfidfVectorizer, NearestNeighbors.
"""
import json
import sys

import numpy as np
from sklearn.feature_extraction.text import TfidfVectorizer
from sklearn.neighbors import NearestNeighbors


def precision_at_k(texts, labels, k, setting):
    if isinstance(setting, dict):
        vectorizer = TfidfVectorizer(max_df=setting["max_df"])
    else:
        vectorizer = TfidfVectorizer(stop_words=setting)
    x = vectorizer.fit_transform(texts)
    nn = NearestNeighbors(n_neighbors=k + 1, metric="cosine", algorithm="brute").fit(x)
    _, idx = nn.kneighbors(x)
    labels = np.asarray(labels)
    hits = []
    for i, row in enumerate(idx):
        others = [j for j in row if j != i][:k]
        hits.append(np.mean(labels[others] == labels[i]))
    return float(np.mean(hits))


def main():
    job = json.load(sys.stdin)
    out = {}
    for name, setting in job["stop_lists"].items():
        out[name] = precision_at_k(job["texts"], job["labels"], job.get("k", 10), setting)
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
