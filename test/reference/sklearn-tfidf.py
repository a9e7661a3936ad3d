"""Reference weights from scikit-learn for Loudword's matrix tests.

Reads one JSON object on stdin:
  {"docs": [[token, ...], ...],
   "variants": [{"sublinear_tf": bool, "binary": bool, "use_idf": bool, "smooth_idf": bool,
                 "norm": "l2" | "l1" | null}, ...],
   "prunes": [{"min_df": {"int": 2} | {"float": 0.01}, "max_df": {...}}, ...]}
and prints one JSON object:
  {"sklearn": version,
   "variants": [{"vocabulary": [...], "indptr": [...], "indices": [...], "data": [...],
                 "idf": [...] | null}, ...],
   "prunes": [{"vocabulary": [...], "indptr": [...], "indices": [...], "data": [...]}, ...]}
The documents arrive already tokenised (by Loudword); a pass-through analyzer makes
scikit-learn count exactly those tokens, so only the weighting and pruning are compared.
"""
import json
import sys

import sklearn
from sklearn.feature_extraction.text import CountVectorizer, TfidfVectorizer


def passthrough(doc):
    return doc


def csr_json(matrix, vocabulary):
    m = matrix.tocsr()
    m.sort_indices()
    return {
        "vocabulary": vocabulary,
        "indptr": m.indptr.tolist(),
        "indices": m.indices.tolist(),
        "data": m.data.tolist(),
    }


def df_value(spec):
    return int(spec["int"]) if "int" in spec else float(spec["float"])


def main():
    request = json.load(sys.stdin)
    docs = request["docs"]
    out = {"sklearn": sklearn.__version__, "variants": [], "prunes": []}
    for v in request.get("variants", []):
        vec = TfidfVectorizer(
            analyzer=passthrough,
            lowercase=False,
            sublinear_tf=v["sublinear_tf"],
            binary=v["binary"],
            use_idf=v["use_idf"],
            smooth_idf=v["smooth_idf"],
            norm=v["norm"],
            dtype=float,
        )
        x = vec.fit_transform(docs)
        result = csr_json(x, vec.get_feature_names_out().tolist())
        result["idf"] = vec.idf_.tolist() if v["use_idf"] else None
        out["variants"].append(result)
    for p in request.get("prunes", []):
        vec = CountVectorizer(
            analyzer=passthrough,
            lowercase=False,
            min_df=df_value(p["min_df"]),
            max_df=df_value(p["max_df"]),
            dtype=float,
        )
        x = vec.fit_transform(docs)
        out["prunes"].append(csr_json(x, vec.get_feature_names_out().tolist()))
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
