#!/usr/bin/env bash
# Installs what the editor tests need, into a cache folder that git ignores (.cache/e2e/ by
# default, TESSERA_E2E_CACHE to move it), and reuses it while its marker file matches:
#   - Debian packages: the toolchain and headers code-server's native modules build with,
#     ripgrep (code-server's search needs it), chromium (the browser), neovim (second LSP client);
#   - code-server (a real VS Code workbench served over HTTP) from the npm registry;
#   - playwright-core, which drives Debian's chromium.
# Exits non-zero, saying why, when anything cannot be set up: the e2e run must fail, never skip.
# Prints the time each phase took.
set -euo pipefail

ROOT=$(cd "$(dirname "$0")/../.." && pwd)
CACHE=${TESSERA_E2E_CACHE:-$ROOT/.cache/e2e}
CODE_SERVER_VERSION=4.100.3
PLAYWRIGHT_VERSION=1.65.1
APT_PACKAGES=(build-essential python3 pkg-config libkrb5-dev libsecret-1-dev ripgrep chromium neovim)
# Native modules are built for one Node ABI: a different Node needs a fresh install.
NODE_ABI=$(node -p 'process.versions.modules')
MARKER_TEXT="code-server=$CODE_SERVER_VERSION playwright-core=$PLAYWRIGHT_VERSION node-abi=$NODE_ABI"

CS_DIR=$CACHE/code-server
TOOLS_DIR=$CACHE/tools
MARKER=$CACHE/installed.txt

mkdir -p "$CACHE"
START=$(date +%s.%N)
PHASE_START=$START
phase_done() {
  local now
  now=$(date +%s.%N)
  printf '[e2e install] %-34s %6.1f s\n' "$1" "$(awk -v a="$now" -v b="$PHASE_START" 'BEGIN { print a - b }')"
  PHASE_START=$now
}
fail() { echo "[e2e install] FAILED: $*" >&2; exit 1; }

# retry N command...: runs the command up to N times, waiting 5, 10, 20 ... s between attempts.
retry() {
  local attempts=$1 n=1 wait=5
  shift
  until "$@"; do
    if [ "$n" -ge "$attempts" ]; then
      echo "[e2e install] giving up after $attempts attempts: $*" >&2
      return 1
    fi
    echo "[e2e install] attempt $n of $attempts failed, retrying in ${wait} s: $*" >&2
    sleep "$wait"
    n=$((n + 1))
    wait=$((wait * 2))
  done
}

# One install at a time (two runs started together share the cache).
exec 9>"$CACHE/.install.lock"
flock -w 900 9 || fail "another install held $CACHE/.install.lock for 15 minutes"

# --- 1. Debian packages --------------------------------------------------------------------
missing=()
for package in "${APT_PACKAGES[@]}"; do
  status=$(dpkg-query -W -f='${Status}' "$package" 2>/dev/null || true)
  [ "$status" = "install ok installed" ] || missing+=("$package")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "[e2e install] Debian packages to install: ${missing[*]}"
  [ "$(id -u)" -eq 0 ] || fail "installing ${missing[*]} needs root (apt-get); run as root or install them first"
  export DEBIAN_FRONTEND=noninteractive
  APT_OPTIONS=(-o DPkg::Lock::Timeout=300 -o Acquire::Retries=3)
  retry 3 apt-get "${APT_OPTIONS[@]}" update -qq || fail "apt-get update"
  retry 3 apt-get "${APT_OPTIONS[@]}" install -y -qq --no-install-recommends "${missing[@]}" >/dev/null \
    || fail "apt-get install ${missing[*]}"
fi
for tool in /usr/bin/chromium /usr/bin/nvim /usr/bin/rg; do
  [ -x "$tool" ] || fail "$tool is missing after installing the Debian packages"
done
phase_done "Debian packages"

# --- 2. code-server and playwright-core, unless the marker says they are in place -----------
installed_ok() {
  [ -f "$MARKER" ] && [ "$(cat "$MARKER")" = "$MARKER_TEXT" ] \
    && [ -x "$CS_DIR/node_modules/.bin/code-server" ] \
    && [ -x "$CS_DIR/node_modules/code-server/lib/vscode/node_modules/@vscode/ripgrep/bin/rg" ] \
    && [ "$(node -p "require('$CS_DIR/node_modules/code-server/package.json').version" 2>/dev/null)" = "$CODE_SERVER_VERSION" ] \
    && [ "$(node -p "require('$TOOLS_DIR/node_modules/playwright-core/package.json').version" 2>/dev/null)" = "$PLAYWRIGHT_VERSION" ]
}

if installed_ok; then
  echo "[e2e install] reusing $CACHE ($MARKER_TEXT)"
else
  echo "[e2e install] installing into $CACHE ($MARKER_TEXT)"
  rm -f "$MARKER"
  # node-gyp builds against the local Node headers instead of downloading them, and npx in
  # node-pty's postinstall may fetch node-gyp without asking.
  export npm_config_nodedir=/usr npm_config_yes=true
  [ -f /usr/include/node/node.h ] || fail "Node headers not found under /usr/include/node (Debian's nodejs ships them; set up Node 20 from Debian)"
  NPM_FLAGS=(--no-audit --no-fund --fetch-retries=5 --fetch-retry-mintimeout=5000)

  # Built in a scratch folder and moved into place at the end, so a broken install never
  # looks complete.
  STAGE=$CACHE/code-server.partial
  rm -rf "$STAGE" "$CS_DIR"
  mkdir -p "$STAGE"
  echo '{"name":"tessera-e2e-code-server","version":"0.0.0","private":true}' > "$STAGE/package.json"
  cd "$STAGE"
  # code-server with its scripts off: its postinstall would try to download ripgrep.
  retry 3 npm install "${NPM_FLAGS[@]}" --ignore-scripts "code-server@$CODE_SERVER_VERSION" || fail "npm install code-server"
  phase_done "npm install code-server"
  # argon2 is loaded at start-up even with --auth none; its prebuilt download is unreachable.
  npm_config_build_from_source=true retry 2 npm rebuild "${NPM_FLAGS[@]}" argon2 >/dev/null || fail "building argon2"
  phase_done "build argon2"
  # What code-server's own postinstall does, by hand.
  cd node_modules/code-server/lib/vscode
  retry 3 npm install "${NPM_FLAGS[@]}" --omit=dev --ignore-scripts || fail "npm install of VS Code's dependencies"
  phase_done "npm install VS Code dependencies"
  # Debian's rg where @vscode/ripgrep expects its download; its postinstall then has nothing to do.
  mkdir -p node_modules/@vscode/ripgrep/bin
  cp /usr/bin/rg node_modules/@vscode/ripgrep/bin/rg
  # Builds kerberos, spdlog, node-pty, native-watchdog, deviceid ... from source.
  retry 2 npm rebuild "${NPM_FLAGS[@]}" >"$CACHE/native-build.log" 2>&1 \
    || { tail -40 "$CACHE/native-build.log" >&2; fail "building VS Code's native modules (log: $CACHE/native-build.log)"; }
  phase_done "build native modules"
  ln -sfn node_modules node_modules.asar
  (cd bin/remote-cli && ln -sfn code-linux.sh code-server)
  (cd bin/helpers && ln -sfn browser-linux.sh browser.sh)
  cd extensions
  retry 3 npm install "${NPM_FLAGS[@]}" --omit=dev >/dev/null || fail "npm install of the built-in extensions' dependencies"
  phase_done "npm install built-in extensions"
  cd "$CACHE"
  mv "$STAGE" "$CS_DIR"

  rm -rf "$TOOLS_DIR"
  mkdir -p "$TOOLS_DIR"
  echo '{"name":"tessera-e2e-tools","version":"0.0.0","private":true}' > "$TOOLS_DIR/package.json"
  (cd "$TOOLS_DIR" && retry 3 npm install "${NPM_FLAGS[@]}" "playwright-core@$PLAYWRIGHT_VERSION" >/dev/null) || fail "npm install playwright-core"
  phase_done "npm install playwright-core"
fi

# --- 3. sanity: the native modules load and the tools run (cheap, so always) ----------------
node -e '
  const base = process.argv[1] + "/node_modules/code-server/lib/vscode/node_modules/";
  for (const m of ["@vscode/spdlog", "node-pty", "native-watchdog", "kerberos", "@parcel/watcher", "@vscode/deviceid"]) require(base + m);
  require(process.argv[1] + "/node_modules/argon2");
  require(process.argv[2] + "/node_modules/playwright-core");
' "$CS_DIR" "$TOOLS_DIR" || fail "a native module or playwright-core does not load; delete $CACHE to reinstall"
"$CS_DIR/node_modules/code-server/lib/vscode/node_modules/@vscode/ripgrep/bin/rg" --version >/dev/null || fail "ripgrep does not run"
/usr/bin/nvim --version >/dev/null || fail "nvim does not run"
/usr/bin/chromium --version >/dev/null 2>&1 || fail "chromium does not run"
echo "$MARKER_TEXT" > "$MARKER"
phase_done "sanity checks"
printf '[e2e install] %-34s %6.1f s\n' "total" "$(awk -v a="$(date +%s.%N)" -v b="$START" 'BEGIN { print a - b }')"
