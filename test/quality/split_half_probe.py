"""Split-half check of a group of grammar words, without labels (a research probe, not the rule).

Does a group of words help find a document's neighbours? Without labels, a document's other half
can stand in for its label: each document's tokens (scikit-learn's default analyzer) are dealt at
random into two halves; neighbours (10, cosine, TfidfVectorizer on the tokens given) are found on
one half, once with the group's words and once without, and judged by how similar they are to the
document on the *other* half's content words (the group and the suggested list removed there),
less the neighbour's mean similarity to every document on that half (so that long documents, alike
to everyone, do not score as good neighbours). Both halves take each role, over three random
deals (seeds 1-3); the score is the mean over documents of (with − without), with a 95% bootstrap
interval over documents. Positive: the group's words lead to neighbours that share the document's
content, as a word marking the kind of document would. The probe prints it beside the change in
leave-one-out precision@10 against the labels (keeping the group − removing it).

The group is Loudword's rule-2 words (the grammar words suggested below half of the documents),
or with --english scikit-learn's English list less the suggestions (for corpora where rule 2
suggested nothing). At most 3,000 evenly spaced documents enter the split-half score.
Usage: split_half_probe.py [--english] DIR NAME... (DIR from dump-suggestions.ts)
"""
import json
import os
import sys
import warnings

import numpy as np
from sklearn.feature_extraction.text import ENGLISH_STOP_WORDS, CountVectorizer, TfidfVectorizer
from sklearn.neighbors import NearestNeighbors

sys.path.insert(0, os.path.dirname(__file__))
from precision_at_k import precision_at_k  # noqa: E402

K = 10
SEEDS = (1, 2, 3)
MAX_DOCS = 3000


def neighbours(x):
    _, idx = NearestNeighbors(n_neighbors=K + 1, metric="cosine", algorithm="brute").fit(x).kneighbors(x)
    return np.array([[j for j in row if j != i][:K] for i, row in enumerate(idx)])


def vectors(token_lists, vocabulary):
    return TfidfVectorizer(analyzer=lambda tokens: tokens, vocabulary=vocabulary).fit_transform(token_lists)


def split_half(texts, suggestions, group):
    tokens = [CountVectorizer().build_analyzer()(t) for t in texts]
    vocabulary = {w for doc in tokens for w in doc}
    content = sorted(w for w in vocabulary if w not in set(suggestions) | set(group))
    group = sorted(w for w in set(group) if w in vocabulary)
    runs = []
    for seed in SEEDS:
        rng = np.random.default_rng(seed)
        halves = ([], [])
        for doc in tokens:
            side = rng.random(len(doc)) < 0.5
            halves[0].append([w for w, s in zip(doc, side) if s])
            halves[1].append([w for w, s in zip(doc, side) if not s])
        for found_on, judged_on in ((0, 1), (1, 0)):
            judge = vectors(halves[judged_on], content)
            plain = vectors(halves[found_on], content)
            rows = np.flatnonzero((judge.getnnz(axis=1) > 0) & (plain.getnnz(axis=1) > 0))
            judge = judge[rows]
            alike_to_all = np.asarray(judge @ np.asarray(judge.sum(axis=0)).ravel()).ravel() / len(rows)
            scores = []
            for x in (vectors(halves[found_on], content + group)[rows], plain[rows]):
                nb = neighbours(x)
                total = np.zeros(len(rows))
                for r in range(K):
                    total += np.asarray(judge.multiply(judge[nb[:, r]]).sum(axis=1)).ravel() - alike_to_all[nb[:, r]]
                scores.append(total / K)
            run = np.full(len(texts), np.nan)
            run[rows] = scores[0] - scores[1]
            runs.append(run)
    d = np.nanmean(runs, axis=0)
    d = d[~np.isnan(d)]
    rng = np.random.default_rng(0)
    boots = [rng.choice(d, len(d)).mean() for _ in range(200)]
    return d.mean(), np.percentile(boots, 2.5), np.percentile(boots, 97.5), len(group)


def main():
    warnings.filterwarnings("ignore")
    args = sys.argv[1:]
    english = args[:1] == ["--english"]
    directory, names = (args[1], args[2:]) if english else (args[0], args[1:])
    print("| corpus | role | group | split-half, with − without [95%] | P@10 keeping − removing the group |")
    print("|---|---|---|---|---|")
    for name in names:
        meta = json.load(open(os.path.join(directory, f"{name}.json")))
        docs = [json.loads(line) for line in open(os.path.join(directory, f"{name}.jsonl"))]
        texts, labels = [d["text"] for d in docs], [d["label"] for d in docs]
        suggestions = meta["suggestions"]
        group = sorted(set(ENGLISH_STOP_WORDS) - set(suggestions)) if english else meta["grammar"]
        if not group:
            print(f"| {name} | {meta['role']} | no group | | |", flush=True)
            continue
        step = max(1.0, len(texts) / MAX_DOCS)
        picked = [texts[int(i * step)] for i in range(min(len(texts), MAX_DOCS))]
        mean, low, high, size = split_half(picked, [w for w in suggestions if w not in set(group)], group)
        without = suggestions if not english else suggestions + group
        kept = [w for w in suggestions if w not in set(group)]
        delta = precision_at_k(texts, labels, K, kept or None) - precision_at_k(texts, labels, K, without)
        print(f"| {name} | {meta['role']} | {size} | {mean:+.5f} [{low:+.5f}, {high:+.5f}] | {delta:+.4f} |", flush=True)


if __name__ == "__main__":
    main()
