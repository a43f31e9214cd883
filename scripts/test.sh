#!/usr/bin/env bash
# Runs every check of the project: formatting, lints (warnings are errors), and all tests.
# Installs what is missing itself (rustfmt and clippy components); downloads only from the
# package registries. Used by .ci/run and by the README.
set -euo pipefail
cd "$(dirname "$0")/.."

for component in rustfmt clippy; do
  if ! rustup component list --installed 2>/dev/null | grep -q "^${component}"; then
    rustup component add "$component"
  fi
done

if ! rustup target list --installed 2>/dev/null | grep -q '^wasm32-unknown-unknown$'; then
  rustup target add wasm32-unknown-unknown
fi

echo "== cargo fmt --check"
cargo fmt --all -- --check
echo "== cargo clippy (warnings are errors)"
cargo clippy --all-targets --locked -- -D warnings
echo "== the engine builds for the browser (wasm32)"
cargo check --lib --locked --target wasm32-unknown-unknown
echo "== cargo test"
cargo test --locked --lib --bins --tests
