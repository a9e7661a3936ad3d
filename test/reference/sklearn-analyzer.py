"""Tokens of each document as scikit-learn's analyzer makes them (the reference for
tokens.tokenizer "pattern"). stdin: JSON {"docs": [...], "token_pattern": str|null,
"lowercase": bool, "ngram_range": [lo, hi]}; stdout: JSON {"sklearn": version, "tokens": [[...]]}.
Uses CountVectorizer(...).build_analyzer(), the function fit_transform applies to each document."""
import json
import sys

import sklearn
from sklearn.feature_extraction.text import CountVectorizer

request = json.load(sys.stdin)
options = {"lowercase": request["lowercase"], "ngram_range": tuple(request["ngram_range"])}
if request.get("token_pattern") is not None:
    options["token_pattern"] = request["token_pattern"]
analyze = CountVectorizer(**options).build_analyzer()
json.dump({"sklearn": sklearn.__version__, "tokens": [analyze(d) for d in request["docs"]]}, sys.stdout, ensure_ascii=False)
