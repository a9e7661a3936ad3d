"""Probe for a labelled review (docs/methods.md section 9, "With labels, a held-out choice"):
choose between Loudword's list (made without labels) and the same list without rule 2's grammar
words by the leave-one-out precision@10 of a random half of the documents (the queries;
neighbours from the whole corpus), and judge the choice on the other half, 20 random splits.
`--guard` (the product's rule, suggest.useLabels, engine/terms/label-choice.ts): the grammar words
are kept only when keeping them raises the deciding half's precision with a 95% paired-bootstrap
interval above zero. `--english`: a third candidate, the list with scikit-learn's English list
added (the first probe's). Prints per corpus the full-corpus precision of every list, how often
each candidate was chosen, and the mean on the judging halves of (chosen - ours) and
(chosen - the better of the English list and max_df 0.5).

  npx tsx test/quality/dump-suggestions.ts DIR [corpus ...]
  /usr/bin/python3 test/quality/held_out_choice.py [--guard] [--english] DIR corpus ...

Source of the measure: scikit-learn (Debian python3-sklearn) TfidfVectorizer, NearestNeighbors.
"""
import json, sys
import numpy as np
from sklearn.feature_extraction.text import TfidfVectorizer, ENGLISH_STOP_WORDS
from sklearn.neighbors import NearestNeighbors

def per_query(texts, labels, k, setting):
    v = TfidfVectorizer(max_df=setting["max_df"]) if isinstance(setting, dict) else TfidfVectorizer(stop_words=setting)
    x = v.fit_transform(texts)
    nn = NearestNeighbors(n_neighbors=k + 1, metric="cosine", algorithm="brute").fit(x)
    _, idx = nn.kneighbors(x)
    out = np.empty(len(texts))
    for i, row in enumerate(idx):
        others = [j for j in row if j != i][:k]
        out[i] = np.mean(labels[others] == labels[i])
    return out

def bootstrap_low(before, after, rng, draws=400):
    """Lower end of the 95% paired percentile bootstrap interval of mean(after - before)."""
    diff = after - before
    means = np.array([diff[rng.integers(0, len(diff), len(diff))].mean() for _ in range(draws)])
    return np.percentile(means, 2.5)

args = [a for a in sys.argv[1:] if not a.startswith("--")]
guard = "--guard" in sys.argv
english = "--english" in sys.argv
d = args[0]
for name in args[1:]:
    docs = [json.loads(l) for l in open(f"{d}/{name}.jsonl")]
    meta = json.load(open(f"{d}/{name}.json"))
    texts = [x["text"] for x in docs]; labels = np.asarray([x["label"] for x in docs])
    ours = list(meta["suggestions"]); grammar = set(meta["grammar"])
    cands = {
        "ours": ours or None,
        "ours-grammar": [w for w in ours if w not in grammar] or None,
    }
    if english:
        cands["ours+english"] = sorted(set(ours) | set(ENGLISH_STOP_WORDS))
    generic = {"none": None, "english": "english", "maxdf": {"max_df": 0.5}}
    pq = {n: per_query(texts, labels, 10, s) for n, s in {**cands, **generic}.items()}
    rng = np.random.default_rng(1)
    brng = np.random.default_rng(2)
    gains, vsbest, picks = [], [], []
    for seed in range(20):
        perm = rng.permutation(len(texts)); h1, h2 = perm[: len(texts)//2], perm[len(texts)//2:]
        pick = max(cands, key=lambda n: pq[n][h1].mean())
        if guard and pick != "ours" and bootstrap_low(pq["ours"][h1], pq[pick][h1], brng) <= 0:
            pick = "ours"
        picks.append(pick)
        gains.append(pq[pick][h2].mean() - pq["ours"][h2].mean())
        vsbest.append(pq[pick][h2].mean() - max(pq["english"][h2].mean(), pq["maxdf"][h2].mean()))
    full = {n: round(float(v.mean()), 4) for n, v in pq.items()}
    from collections import Counter
    print(f"{name} ({meta['role']}): full {full}; picks {dict(Counter(picks))}; chosen-ours {np.mean(gains):+.4f}; chosen-max(E,M) {np.mean(vsbest):+.4f}", flush=True)
