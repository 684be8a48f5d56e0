# Shared set-up for scripts/start and scripts/test. Each step installs what is
# missing and is quick when everything is present. Only the package
# registries are used: rustup's own target, Debian's packages, npm, PyPI.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

say() { printf '\033[1m==> %s\033[0m\n' "$*" >&2; }

need_wasm_target() {
  if ! rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown; then
    say "adding the wasm32-unknown-unknown target"
    rustup target add wasm32-unknown-unknown
  fi
}

apt_updated=0
apt_install() {
  local sudo=""
  [ "$(id -u)" -ne 0 ] && sudo="sudo"
  if [ "$apt_updated" -eq 0 ]; then
    $sudo apt-get update -qq
    apt_updated=1
  fi
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq "$@" >/dev/null
}

need_chromium() {
  if [ ! -x /usr/bin/chromium ] || [ ! -x /usr/bin/chromedriver ]; then
    say "installing Debian's chromium and chromium-driver"
    apt_install chromium chromium-driver
  fi
}

need_node_packages() {
  if ! command -v node >/dev/null || ! command -v npm >/dev/null; then
    say "installing Node.js and npm from Debian"
    apt_install nodejs npm
  fi
  if [ ! -d tests/browser/node_modules/playwright-core ]; then
    say "installing the browser tests' npm packages"
    (cd tests/browser && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

need_python_packages() {
  if ! python3 -c "import scipy.special" 2>/dev/null; then
    say "installing scipy (reference values for the tests)"
    python3 -m pip install --quiet -r tests/requirements.txt || \
      python3 -m pip install --quiet --break-system-packages -r tests/requirements.txt
  fi
}

# Builds dist/magwright.html: the web crate to wasm, then the bundler
# (wasm-bindgen as a library, same pinned version) inlines glue and wasm.
# MAGWRIGHT_WASM_PROFILE=wasm-dev builds faster for iterating (bigger file).
build_page() {
  need_wasm_target
  local profile="${MAGWRIGHT_WASM_PROFILE:-wasm}"
  local target="${CARGO_TARGET_DIR:-$ROOT/target}"
  case "$target" in /*) ;; *) target="$ROOT/$target" ;; esac
  say "building the web client (wasm, profile $profile)"
  cargo build --quiet -p magwright-web --target wasm32-unknown-unknown --profile "$profile"
  say "bundling dist/magwright.html"
  cargo run --quiet -p magwright-bundle -- \
    "$target/wasm32-unknown-unknown/$profile/magwright_web.wasm" index.html dist/magwright.html
  cp dist/magwright.html dist/index.html
}
