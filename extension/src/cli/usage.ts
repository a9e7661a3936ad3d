export const USAGE = `loudword — how healthy are the TF-IDF distances of a corpus, and which terms distort them

Usage:
  loudword review <corpus> [options]   review the corpus and print the findings
  loudword apply <corpus> [options]    review, then add the suggested terms to the stop list file

Corpus: CSV, TSV, JSON Lines (.jsonl/.ndjson) or plain text with one document per line.

Options:
  --text FIELD          column or key holding the text (default: the one with the longest texts)
  --label FIELD         column or key with a class label; enables label precision@k
  --config FILE         loudword.json to read (default: loudword.json beside the corpus, then in
                        the current folder)
  --no-config           ignore any loudword.json
  --stoplist FILE       the stop list file (default: "stopList" of the config, else stoplist.txt)
  --input-format F      csv | tsv | jsonl | text (default: from the file name and content)
  --format F            text | json | md | html (default text; json prints the Report)
  --out FILE            write the output to FILE instead of standard output
  --sample N            documents in the seeded sample for the neighbour measures (default 2000)
  --k N                 neighbours per document (default 10)
  --seed N              sample seed (default 1)
  --fail-on-suggestions exit with status 3 when terms are suggested (for CI)
  --dry-run             with apply: show what would be added, change nothing
  -q, --quiet           no progress on standard error
  -h, --help            this help
  -v, --version         the version

Exit status: 0 done, 1 the input or config is wrong (the message names file and line),
2 the command line is wrong, 3 suggestions exist and --fail-on-suggestions was given,
4 an internal error (please report it).
`;
