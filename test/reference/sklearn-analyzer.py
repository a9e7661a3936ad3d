"""Tokens of each document as scikit-learn's analyzer makes them (the reference for
tokens.tokenizer "pattern"). stdin: JSON {"docs": [...], "jobs": [{"token_pattern": str|null,
"lowercase": bool, "ngram_range": [lo, hi]}, ...]}; stdout: JSON {"sklearn": version,
"tokens": [[[...] per document] per job]}. Uses CountVectorizer(...).build_analyzer(), the
function fit_transform applies to each document. One process for many jobs: importing
scikit-learn takes seconds."""
import json
import sys

import sklearn
from sklearn.feature_extraction.text import CountVectorizer

request = json.load(sys.stdin)
answers = []
for job in request["jobs"]:
    options = {"lowercase": job["lowercase"], "ngram_range": tuple(job["ngram_range"])}
    if job.get("token_pattern") is not None:
        options["token_pattern"] = job["token_pattern"]
    analyze = CountVectorizer(**options).build_analyzer()
    answers.append([analyze(d) for d in request["docs"]])
json.dump({"sklearn": sklearn.__version__, "tokens": answers}, sys.stdout, ensure_ascii=False)
