"""Is there a stop list that meets the issue's bounds for two labellings of the same texts at once?
A research probe that USES the labels (same-texts-probe.ts --search): start from scikit-learn's
English list and keep one of its words at a time — the one after which both labellings are
closest to their bounds (ours >= max(English, max_df 0.5) - 0.002 and >= none - 0.005, summed
shortfall) — until both are met or no word brings them closer.
Usage: list_for_both_labels.py FILE.jsonl LABEL_A LABEL_B (each line: {"text": ..., LABEL_A: ..., LABEL_B: ...})
Source: scikit-learn (Debian python3-sklearn) TfidfVectorizer defaults, cosine, brute-force neighbours.
"""
import json
import sys

import numpy as np
from sklearn.feature_extraction.text import ENGLISH_STOP_WORDS, CountVectorizer, TfidfVectorizer
from sklearn.neighbors import NearestNeighbors

K = 10


def main():
    path, names = sys.argv[1], sys.argv[2:4]
    docs = [json.loads(line) for line in open(path)]
    texts = [d["text"] for d in docs]
    labels = {n: np.asarray([d[n] for d in docs]) for n in names}

    def precision(**vectorizer):
        x = TfidfVectorizer(**vectorizer).fit_transform(texts)
        _, idx = NearestNeighbors(n_neighbors=K + 1, metric="cosine", algorithm="brute").fit(x).kneighbors(x)
        others = [[j for j in row if j != i][:K] for i, row in enumerate(idx)]
        return {n: float(np.mean([np.mean(y[o] == y[i]) for i, o in enumerate(others)])) for n, y in labels.items()}

    vocabulary = set(CountVectorizer().fit(texts).vocabulary_)
    english = sorted(set(ENGLISH_STOP_WORDS) & vocabulary)
    none, eng, max_df = precision(), precision(stop_words=english), precision(max_df=0.5)
    need = {n: max(max(eng[n], max_df[n]) - 0.002, none[n] - 0.005) for n in names}
    shortfall = lambda p: sum(max(0.0, need[n] - p[n]) for n in names)  # noqa: E731
    show = lambda p: ", ".join(f"{n} {p[n]:.4f} (bound {need[n]:.4f})" for n in names)  # noqa: E731
    print(f"none: {show(none)}\nEnglish list ({len(english)} words in the texts): {show(eng)}", flush=True)
    listed, current = set(english), eng
    kept = []
    while shortfall(current) > 1e-12:
        best = min(((shortfall(p), w, p) for w in sorted(listed) for p in [precision(stop_words=sorted(listed - {w}))]), key=lambda t: t[0])
        if best[0] >= shortfall(current):
            print(f"no word brings both closer; shortfall {shortfall(current):.4f}")
            return
        listed.discard(best[1])
        kept.append(best[1])
        current = best[2]
        print(f"keep {', '.join(kept)}: {show(current)}", flush=True)
    print(f"both bounds met by the English list less {', '.join(kept) if kept else 'nothing'}")


if __name__ == "__main__":
    main()
