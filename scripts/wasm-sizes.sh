#!/usr/bin/env bash
# Prints the sizes of the browser build's .wasm files (raw and gzip -9, in bytes), for README
# "Browser targets": the page's and the plan worker's are loaded when the page opens, the
# reading worker's only at the first large text or workbook. Run after a release build
# (bash scripts/start.sh, or trunk build --release).
set -euo pipefail
dir=${1:-dist}
at_start=0
for wasm in "$dir"/*_bg.wasm; do
  raw=$(stat -c %s "$wasm")
  packed=$(gzip -9 -n -c "$wasm" | wc -c)
  case $(basename "$wasm") in
    morrowcast-reader_bg.wasm) when="at the first large text or workbook" ;;
    *) when="when the page opens"; at_start=$((at_start + packed)) ;;
  esac
  printf '%-45s raw %9d  gzip %8d  loaded %s\n' "$(basename "$wasm")" "$raw" "$packed" "$when"
done
printf 'loaded when the page opens, gzip: %d bytes\n' "$at_start"
