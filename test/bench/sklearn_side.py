"""The scikit-learn side of `npm run bench`: what a practitioner would run in a notebook.

Run with /usr/bin/python3 (Debian python3-sklearn). Prints one JSON object on stdout:
wall (and CPU) seconds for reading, TfidfVectorizer().fit_transform alone, and the brute-force
cosine k-NN of the sampled queries; peak RSS of this process; nonzeros and tokens.

usage: sklearn_side.py FILE.csv [--text text] [--queries 2000] [--k 10] [--seed 1] [--no-knn]
"""
import argparse
import csv
import json
import resource
import sys
import time

import numpy as np
import sklearn
from sklearn.feature_extraction.text import TfidfVectorizer
from sklearn.neighbors import NearestNeighbors


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("file")
    parser.add_argument("--text", default="text")
    parser.add_argument("--queries", type=int, default=2000)
    parser.add_argument("--k", type=int, default=10)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--no-knn", action="store_true")
    args = parser.parse_args()

    # Generated documents are one line each, but the field limit protects real corpora too.
    csv.field_size_limit(sys.maxsize)
    started = time.perf_counter()
    with open(args.file, newline="", encoding="utf-8") as f:
        reader = csv.reader(f)
        header = next(reader)
        column = header.index(args.text)
        texts = [row[column] for row in reader]
    read_seconds = time.perf_counter() - started

    vectorizer = TfidfVectorizer()
    started, cpu_started = time.perf_counter(), time.process_time()
    X = vectorizer.fit_transform(texts)
    fit_seconds = time.perf_counter() - started
    fit_cpu_seconds = time.process_time() - cpu_started

    result = {
        "sklearn": sklearn.__version__,
        "documents": len(texts),
        "readSeconds": read_seconds,
        "fitTransformSeconds": fit_seconds,
        "fitTransformCpuSeconds": fit_cpu_seconds,
        "terms": len(vectorizer.vocabulary_),
        "nonzeros": int(X.nnz),
    }

    if not args.no_knn:
        n = X.shape[0]
        queries = min(args.queries, n)
        sample = np.random.RandomState(args.seed).choice(n, size=queries, replace=False)
        started, cpu_started = time.perf_counter(), time.process_time()
        # k+1 because each query finds itself first.
        nn = NearestNeighbors(n_neighbors=min(args.k + 1, n), metric="cosine", algorithm="brute")
        nn.fit(X)
        nn.kneighbors(X[sample])
        result["knnSeconds"] = time.perf_counter() - started
        result["knnCpuSeconds"] = time.process_time() - cpu_started
        result["queries"] = int(queries)
        result["k"] = args.k

    # Counted after the timed parts with the vectorizer's own analyzer, so the figure is
    # exactly the token stream fit_transform consumed.
    analyze = vectorizer.build_analyzer()
    result["tokens"] = sum(len(analyze(t)) for t in texts)
    # Linux reports ru_maxrss in kilobytes.
    result["peakRssBytes"] = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss * 1024
    print(json.dumps(result))


if __name__ == "__main__":
    main()
