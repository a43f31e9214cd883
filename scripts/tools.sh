#!/usr/bin/env bash
# Installs what the browser build and its tests need, when missing, at the pinned versions.
# Sourced by start.sh and test.sh. Downloads only from the package registries (crates.io, npm,
# Debian). Facts behind each pin: DEVELOPERS.md, "Browser toolchain".
TRUNK_VERSION=0.21.14
BINARYEN_NOTE="binaryen 132 from npm (package.json); never Debian's binaryen, whose wasm-opt breaks the page"

export PATH="$PWD/node_modules/.bin:$HOME/.cargo/bin:$PATH"

say() { printf '== %s\n' "$*"; }

# The wasm-bindgen version Cargo.lock resolved; the CLI must equal it.
wasm_bindgen_version() {
  awk '/^name = "wasm-bindgen"$/ { getline; gsub(/version = |"/, ""); print; exit }' Cargo.lock
}

apt_install() {
  if [ "$(id -u)" -ne 0 ]; then
    echo "missing Debian packages: $*; install them (apt-get install $*) or run as root" >&2
    return 1
  fi
  if [ -z "${APT_UPDATED:-}" ]; then
    apt-get update -qq
    APT_UPDATED=1
  fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

ensure_wasm_target() {
  if ! rustup target list --installed 2>/dev/null | grep -qx wasm32-unknown-unknown; then
    say "adding the wasm32-unknown-unknown target"
    rustup target add wasm32-unknown-unknown
  fi
}

ensure_trunk() {
  if ! trunk --version 2>/dev/null | grep -q "trunk $TRUNK_VERSION"; then
    say "installing trunk $TRUNK_VERSION (about 13 minutes once)"
    nice cargo install --locked trunk --version "$TRUNK_VERSION"
  fi
}

ensure_wasm_bindgen() {
  local want
  want=$(wasm_bindgen_version)
  if ! wasm-bindgen --version 2>/dev/null | grep -q "wasm-bindgen $want"; then
    say "installing wasm-bindgen-cli $want (about 10 minutes once)"
    # Not --locked: its lock file names a crate version the registry lacks.
    nice cargo install wasm-bindgen-cli --version "$want"
  fi
}

ensure_wasm_opt() {
  if ! command -v npm >/dev/null 2>&1; then
    say "installing npm (Debian) for $BINARYEN_NOTE"
    apt_install npm
  fi
  if ! wasm-opt --version 2>/dev/null | grep -q "version 132"; then
    say "installing $BINARYEN_NOTE"
    npm ci --no-audit --no-fund --silent
  fi
}

ensure_chromium() {
  local missing=()
  command -v chromium >/dev/null 2>&1 || missing+=(chromium)
  command -v chromedriver >/dev/null 2>&1 || missing+=(chromium-driver)
  if [ ${#missing[@]} -gt 0 ]; then
    say "installing ${missing[*]} (Debian)"
    apt_install "${missing[@]}"
  fi
}

# Firefox for the single file's test (tests/e2e/firefox.rs): Debian's firefox-esr, and
# geckodriver from crates.io (about 2 minutes once).
GECKODRIVER_VERSION=0.37.1
ensure_firefox() {
  if ! command -v firefox-esr >/dev/null 2>&1; then
    say "installing firefox-esr (Debian)"
    apt_install firefox-esr
  fi
  if ! geckodriver --version 2>/dev/null | grep -q "geckodriver $GECKODRIVER_VERSION"; then
    say "installing geckodriver $GECKODRIVER_VERSION (about 2 minutes once)"
    nice cargo install --locked geckodriver --version "$GECKODRIVER_VERSION"
  fi
}

# scripts/single-file.sh hashes and encodes with Perl's Digest::SHA and MIME::Base64, which
# Debian ships in `perl` (not in the minimal perl-base).
ensure_perl_modules() {
  if ! perl -MDigest::SHA -MMIME::Base64 -e 1 2>/dev/null; then
    say "installing perl (Debian) for Digest::SHA and MIME::Base64"
    apt_install perl
  fi
}

ensure_browser_build_tools() {
  ensure_perl_modules
  ensure_wasm_target
  ensure_trunk
  ensure_wasm_bindgen
  ensure_wasm_opt
}
