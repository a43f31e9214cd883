#!/usr/bin/env bash
# Runs every check of the project: formatting, lints (warnings are errors) natively and for the
# browser build, the release build of the app, and all tests, the browser ones in headless
# Chromium against that build. Installs what is missing itself (rustup components and target,
# trunk, wasm-bindgen-cli, binaryen from npm, Debian's chromium, chromium-driver and
# firefox-esr, geckodriver); downloads
# only from the package registries. Used by .ci/run and by the README.
set -euo pipefail
cd "$(dirname "$0")/.."

for component in rustfmt clippy; do
  if ! rustup component list --installed 2>/dev/null | grep -q "^${component}"; then
    rustup component add "$component"
  fi
done
source scripts/tools.sh
ensure_browser_build_tools
ensure_chromium
ensure_firefox

say "cargo fmt --check"
cargo fmt --all -- --check
say "cargo clippy, native (warnings are errors)"
cargo clippy --workspace --all-targets --locked -- -D warnings
say "cargo clippy, the engine alone as a caller gets it (no serde, no internals) and for wasm32"
cargo clippy -p morrowcast-engine --locked -- -D warnings
cargo clippy -p morrowcast-engine --locked --target wasm32-unknown-unknown -- -D warnings
say "cargo clippy, browser build (warnings are errors)"
cargo clippy --locked --target wasm32-unknown-unknown -p morrowcast-app --lib --bins -- -D warnings
cargo clippy --locked --target wasm32-unknown-unknown -p morrowcast-app --lib --profile test -- -D warnings
say "building the app (trunk, release) into dist/"
rm -rf dist
trunk --skip-version-check build --release
say "cargo test (the browser tests drive headless Chromium against dist/)"
MORROWCAST_REQUIRE_DIST=1 cargo test --locked --workspace
say "the page's pieces in headless Chromium (wasm-bindgen-test)"
CHROMEDRIVER=/usr/bin/chromedriver cargo test --locked --target wasm32-unknown-unknown -p morrowcast-app --lib
