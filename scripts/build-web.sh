#!/usr/bin/env bash
# Builds the browser app into build/web/site (index.html, tidewright.js/.wasm, manifest,
# service worker, icons). Assumes scripts/setup.sh has run.
set -euo pipefail
cd "$(dirname "$0")/.."
export NODE_PATH=/usr/share/nodejs   # acorn for Emscripten's JS optimizer (toolchain.md)
emcmake cmake -S . -B build/web -G Ninja -DCMAKE_BUILD_TYPE=Release -DTW_BUILD_WEB=ON \
  -DTW_BUILD_TESTS=OFF -DTW_IMGUI_DIR="$PWD/.cache/imgui" >/dev/null
ninja -C build/web -j"${TW_JOBS:-$(nproc)}" tidewright-web tidewright-site
