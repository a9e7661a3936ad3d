"""Adaptation of suggested grammar words across content neighbours (a research probe).

For a corpus and Loudword's suggested list, each document's 10 nearest neighbours are found with
the list removed (the content words alone; scikit-learn TfidfVectorizer defaults, cosine). A
suggested grammar word w in df documents of n "adapts" when it turns up in the content neighbours
of the documents that hold it more often than its rate predicts:
    adaptation(w) = P(w in a content neighbour | w in the document) / (df / n),
the neighbour form of Church's adaptation (Church 2000, "Empirical estimates of adaptation: the
chance of two Noriegas is closer to p/2 than p^2", COLING), with a binomial z for its noise. A
word that adapts goes where the content already goes: it may mark the kind of document. The probe
prints precision@10 (leave-one-out, the labels) of the list without the words above each limit.
`--form cohesion` measures the exact, neighbour-free form instead (see cohesion()), and
`--form cohesion-length` that form against a length-matched expectation (cohesion_length()).
Usage: adaptation_probe.py [--form cohesion|cohesion-length] DIR NAME... (DIR holds NAME.jsonl and NAME.json
from adaptation-probe.ts)
"""
import json
import os
import sys
import warnings

import numpy as np
from sklearn.feature_extraction.text import CountVectorizer, TfidfVectorizer
from sklearn.neighbors import NearestNeighbors

sys.path.insert(0, os.path.dirname(__file__))
from precision_at_k import precision_at_k  # noqa: E402

K = 10
LIMITS = [1.5, 2, 3]
MIN_DF = 5
MIN_Z = 3


def content_and_holders(texts, suggestions, candidates):
    """The content vectors (the list removed), which documents have any, and for each candidate
    word the documents that hold it (None when there is no candidate)."""
    x = TfidfVectorizer(stop_words=suggestions).fit_transform(texts)
    words = sorted(set(candidates))
    if not words:
        return x, x.getnnz(axis=1) > 0, None
    holds = CountVectorizer(vocabulary=words, binary=True, token_pattern=r"(?u)\b\w+\b|'s").fit_transform(texts).tocsc()
    holders = {w: holds.indices[holds.indptr[col]:holds.indptr[col + 1]] for col, w in enumerate(words)}
    return x, x.getnnz(axis=1) > 0, holders


def adaptation(texts, suggestions, candidates):
    x, has_content, holders = content_and_holders(texts, suggestions, candidates)
    if holders is None:
        return {}
    _, idx = NearestNeighbors(n_neighbors=K + 1, metric="cosine", algorithm="brute").fit(x).kneighbors(x)
    neighbours = [[j for j in row if j != i][:K] for i, row in enumerate(idx)]
    n = len(texts)
    out = {}
    for w, rows in holders.items():
        df = len(rows)
        if df < MIN_DF or df >= n:
            continue
        mask = np.zeros(n, bool)
        mask[rows] = True
        hits = sum(int(mask[neighbours[d]].sum()) for d in rows if has_content[d])
        trials = K * sum(1 for d in rows if has_content[d])
        if trials == 0:
            continue
        p = df / n
        out[w] = ((hits / trials) / p, (hits - trials * p) / np.sqrt(trials * p * (1 - p)))
    return out


def cohesion(texts, suggestions, candidates):
    """The exact, neighbour-free form: mean content cosine among the documents that hold w, over
    that of all pairs, from sums of content vectors (|sum|^2 - count over count(count - 1))."""
    x, has_content, holders = content_and_holders(texts, suggestions, candidates)
    if holders is None:
        return {}
    m = int(has_content.sum())
    total = np.asarray(x.sum(axis=0)).ravel()
    all_pairs = (total @ total - m) / (m * (m - 1))
    return {w: (mean, np.inf) for w, mean, _ in holders_mean_cosine(x, has_content, holders, lambda _: all_pairs)}


def holders_mean_cosine(x, has_content, holders, expected):
    """(w, observed ÷ expected mean content cosine between the documents that hold w, their rows)
    for each w in at least MIN_DF documents with content; `expected(rows)` gives the divisor. The
    observed mean is (|sum of their unit rows|² − count) / (count(count − 1)). No noise model:
    callers set z past MIN_Z so that only the ratio decides."""
    for w, rows in holders.items():
        rows = rows[has_content[rows]]
        count = len(rows)
        if count < MIN_DF:
            continue
        s = np.asarray(x[rows].sum(axis=0)).ravel()
        yield w, ((s @ s - count) / (count * (count - 1))) / expected(rows), rows


def cohesion_length(texts, suggestions, candidates, bins=10):
    """The exact form against a length-matched expectation: longer documents are alike to more
    documents, and a grammar word's holders are the longer ones, so cohesion alone rates every
    common word as marking a kind. The documents with content are put in ten bins by their number
    of whitespace-separated words (deciles); the mean content cosine between two documents of bins
    p and q comes from the bins' sums of content vectors, and w's expected mean cosine is that of
    its holders' pairs bin by bin. Exact and without neighbours, as cohesion()."""
    x, has_content, holders = content_and_holders(texts, suggestions, candidates)
    if holders is None:
        return {}
    lengths = np.array([len(t.split()) for t in texts])
    edges = np.quantile(lengths[has_content], np.linspace(0, 1, bins + 1)[1:-1])
    bin_of = np.searchsorted(edges, lengths, side="right")
    with_content = np.flatnonzero(has_content)
    sums = np.vstack([np.asarray(x[with_content[bin_of[with_content] == b]].sum(axis=0)).ravel() for b in range(bins)])
    sizes = np.bincount(bin_of[with_content], minlength=bins).astype(float)
    dots = sums @ sums.T
    pairs = np.outer(sizes, sizes) - np.diag(sizes)  # ordered pairs of distinct documents
    mean_cos = np.divide(dots - np.diag(sizes), pairs, out=np.zeros_like(dots), where=pairs > 0)

    def expected(rows):
        h = np.bincount(bin_of[rows], minlength=bins).astype(float)
        return (h @ mean_cos @ h - h @ np.diag(mean_cos)) / (len(rows) * (len(rows) - 1))

    return {w: (ratio, np.inf) for w, ratio, _ in holders_mean_cosine(x, has_content, holders, expected)}


def main():
    warnings.filterwarnings("ignore")
    args = sys.argv[1:]
    form = adaptation
    forms = {"cohesion": cohesion, "cohesion-length": cohesion_length}
    if args[:1] == ["--form"]:
        form, args = forms[args[1]], args[2:]
    directory, names = args[0], args[1:]
    print("| corpus | role | ours | " + " | ".join(f"keep > {t}" for t in LIMITS) + " |")
    print("|---|---|---|" + "---|" * len(LIMITS))
    for name in names:
        meta = json.load(open(os.path.join(directory, f"{name}.json")))
        docs = [json.loads(line) for line in open(os.path.join(directory, f"{name}.jsonl"))]
        texts = [d["text"] for d in docs]
        labels = [d["label"] for d in docs]
        ours = meta["suggestions"]
        if not ours:
            print(f"| {name} | {meta['role']} | nothing suggested |" + " |" * len(LIMITS))
            continue
        base = precision_at_k(texts, labels, K, ours)
        scores = form(texts, ours, meta["grammar"])
        cells = []
        for limit in LIMITS:
            keep = {w for w, (a, z) in scores.items() if a > limit and z > MIN_Z}
            if not keep:
                cells.append("+0.0000 (0)")
                continue
            p = precision_at_k(texts, labels, K, [w for w in ours if w not in keep])
            shown = " ".join(sorted(keep, key=lambda w: -scores[w][0])[:4])
            cells.append(f"{p - base:+.4f} ({len(keep)}: {shown})")
        print(f"| {name} | {meta['role']} | {base:.4f} | " + " | ".join(cells) + " |", flush=True)


if __name__ == "__main__":
    main()
