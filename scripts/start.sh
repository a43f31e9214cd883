#!/usr/bin/env bash
# The main job on the demo data: builds the command line and forecasts every demo item.
# (Until the browser app lands, this is the whole tool.)
set -euo pipefail
cd "$(dirname "$0")/.."
cargo build --release --locked --bin morrowcast
./target/release/morrowcast demo | ./target/release/morrowcast forecast - "$@"
