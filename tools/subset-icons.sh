#!/usr/bin/env bash
# Rebuilds the self-hosted icon font: the Material Symbols (outlined) woff2 from node_modules cut down
# to the ligatures the app names (tools/icon-names.js), so the first load does not fetch ~4 MB.
# Needs Debian's fonttools and brotli: apt-get install -y python3-fonttools python3-brotli
# Writes src/styles/fonts/material-symbols-subset.woff2 and, beside it, the list of icon names it holds.
set -euo pipefail
cd "$(dirname "$0")/.."
out=src/styles/fonts
mkdir -p "$out"
node tools/icon-names.js > "$out/material-symbols-subset.txt"
/usr/bin/python3 tools/subset-icons.py node_modules/material-symbols/material-symbols-outlined.woff2 \
  "$out/material-symbols-subset.txt" "$out/material-symbols-subset.woff2"
