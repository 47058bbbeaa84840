#!/usr/bin/env bash
# Installs whatever is missing for building and testing Sharpfield, into a per-user cache folder
# keyed by tool version, so that fresh clones (CI) reuse tools built once. Sourced by `serve` and
# `test`; safe to run again: each step checks first and does nothing when the tool is present.
# Versions are pinned here and in Trunk.toml; see DEVELOPERS.md before changing one.
set -euo pipefail

TRUNK_VERSION=0.21.14
WASM_BINDGEN_VERSION=0.2.130   # must equal the wasm-bindgen version in Cargo.lock
BINARYEN_VERSION=132.0.0       # npm package; its wasm-opt prints version_132
PLAYWRIGHT_VERSION=1.65.1      # npm playwright-core, driving Debian's chromium

TOOLS_ROOT="${SHARPFIELD_TOOLS:-${XDG_CACHE_HOME:-$HOME/.cache}/sharpfield-tools}"
TRUNK_ROOT="$TOOLS_ROOT/trunk-$TRUNK_VERSION"
BINDGEN_ROOT="$TOOLS_ROOT/wasm-bindgen-$WASM_BINDGEN_VERSION"
BINARYEN_ROOT="$TOOLS_ROOT/binaryen-$BINARYEN_VERSION"
PLAYWRIGHT_ROOT="$TOOLS_ROOT/playwright-core-$PLAYWRIGHT_VERSION"

log() { printf '[tools] %s\n' "$*" >&2; }

ensure_wasm_target() {
  if ! rustup target list --installed | grep -qx wasm32-unknown-unknown; then
    log "adding the wasm32-unknown-unknown target"
    rustup target add wasm32-unknown-unknown
  fi
}

ensure_trunk() {
  if [ ! -x "$TRUNK_ROOT/bin/trunk" ]; then
    log "building trunk $TRUNK_VERSION into $TRUNK_ROOT (about 8 minutes on 2 cores)"
    cargo install --locked --root "$TRUNK_ROOT" "trunk@$TRUNK_VERSION"
  fi
}

ensure_wasm_bindgen() {
  if [ ! -x "$BINDGEN_ROOT/bin/wasm-bindgen" ]; then
    log "building wasm-bindgen-cli $WASM_BINDGEN_VERSION into $BINDGEN_ROOT (about 3 minutes)"
    # Not --locked: one of its locked dependencies has left the index (toolchain.md).
    cargo install --root "$BINDGEN_ROOT" "wasm-bindgen-cli@$WASM_BINDGEN_VERSION"
  fi
}

ensure_npm_package() { # root package@version
  local root=$1 spec=$2
  if [ ! -f "$root/.installed" ]; then
    log "installing npm $spec into $root"
    mkdir -p "$root"
    npm install --silent --no-audit --no-fund --prefix "$root" "$spec"
    touch "$root/.installed"
  fi
}

ensure_debian_packages() { # only what the tests need: a browser, its driver, a PDF reader
  local missing=()
  [ -x /usr/bin/chromium ] || missing+=(chromium)
  [ -x /usr/bin/chromedriver ] || missing+=(chromium-driver)
  command -v pdfinfo >/dev/null 2>&1 || missing+=(poppler-utils)
  if [ ${#missing[@]} -gt 0 ]; then
    if [ "$(id -u)" -ne 0 ]; then
      log "missing Debian packages: ${missing[*]}; install them as root (apt-get install ${missing[*]})"
      return 1
    fi
    log "installing Debian packages: ${missing[*]}"
    DEBIAN_FRONTEND=noninteractive apt-get update -qq
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null
  fi
}

ensure_build_tools() {
  ensure_wasm_target
  ensure_trunk
  ensure_wasm_bindgen
  ensure_npm_package "$BINARYEN_ROOT" "binaryen@$BINARYEN_VERSION"
  # Trunk takes the first wasm-bindgen and wasm-opt on PATH; these are the pinned ones.
  export PATH="$TRUNK_ROOT/bin:$BINDGEN_ROOT/bin:$BINARYEN_ROOT/node_modules/.bin:$PATH"
}

ensure_test_tools() {
  ensure_build_tools
  ensure_debian_packages
  ensure_npm_package "$PLAYWRIGHT_ROOT" "playwright-core@$PLAYWRIGHT_VERSION"
  export NODE_PATH="$PLAYWRIGHT_ROOT/node_modules${NODE_PATH:+:$NODE_PATH}"
  export CHROMEDRIVER=/usr/bin/chromedriver
}

if [ "${BASH_SOURCE[0]}" = "$0" ]; then
  ensure_test_tools
  log "all tools present under $TOOLS_ROOT"
fi
