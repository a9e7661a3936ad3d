#!/usr/bin/env bash
# Installs the Debian packages the tests check against, when they are missing:
#   python3-sklearn  the reference library for the weighting checks and the benchmark
#   fortunes         an open labelled corpus (one category per file)
#   fortunes-de, -es German and Spanish fortunes: text that is not English
#   chromium         renders the panel and the HTML report in the UI tests
#   xz-utils, bzip2  compress a corpus the way users do, for the message on formats it cannot read
#   python3-pandas   writes a data frame in each of its layouts, as users save their corpora
# Runs apt only when something is missing; without root it says what to install instead.
set -euo pipefail
missing=()
/usr/bin/python3 -c 'import sklearn' >/dev/null 2>&1 || missing+=(python3-sklearn)
[ -f /usr/share/games/fortunes/computers ] || missing+=(fortunes)
[ -d /usr/share/games/fortunes/de ] || missing+=(fortunes-de)
[ -d /usr/share/games/fortunes/es ] || missing+=(fortunes-es)
[ -x /usr/bin/chromium ] || missing+=(chromium)
command -v xz >/dev/null 2>&1 || missing+=(xz-utils)
/usr/bin/python3 -c 'import pandas' >/dev/null 2>&1 || missing+=(python3-pandas)
command -v bzip2 >/dev/null 2>&1 || missing+=(bzip2)
for extra in "$@"; do dpkg -s "$extra" >/dev/null 2>&1 || missing+=("$extra"); done
[ ${#missing[@]} -eq 0 ] && exit 0
if [ "$(id -u)" != 0 ]; then
  echo "loudword tests need these Debian packages: ${missing[*]}" >&2
  echo "install them with: sudo apt-get install -y ${missing[*]}" >&2
  exit 1
fi
echo "installing Debian packages: ${missing[*]}" >&2
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq "${missing[@]}" >/dev/null
