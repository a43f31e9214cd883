#!/usr/bin/env bash
# The README's first command: installs what is missing (wasm target, trunk, wasm-bindgen-cli,
# wasm-opt), builds the browser app in release mode and serves it on http://127.0.0.1:8080/
# with the demo loaded on first visit. Downloads only from the package registries.
#
#   bash scripts/start.sh              build and serve the app (PORT=... to change the port)
#   bash scripts/start.sh --build      only build the static site into dist/
#   bash scripts/start.sh --cli [ARGS] the command line on the demo instead (forecast ARGS)
set -euo pipefail
cd "$(dirname "$0")/.."

if [ "${1:-}" = "--cli" ]; then
  shift
  cargo build --release --locked -p morrowcast-cli
  ./target/release/morrowcast demo | ./target/release/morrowcast forecast - "$@"
  exit 0
fi

source scripts/tools.sh
ensure_browser_build_tools

if [ "${1:-}" = "--build" ]; then
  say "building the app into dist/"
  trunk --skip-version-check build --release
  exit 0
fi

port=${PORT:-8080}
say "building and serving the app on http://127.0.0.1:$port/ (Ctrl-C stops)"
exec trunk --skip-version-check serve --release --address 127.0.0.1 --port "$port" --no-autoreload
