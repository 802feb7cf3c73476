#!/usr/bin/env bash
# Installs what Tidewright's build and tests need, only what is missing (idempotent).
# Debian packages through apt-get, Dear ImGui sources through `apt-get source imgui` into
# .cache/ (never committed), the browser-test driver through npm.
#   scripts/setup.sh            everything (app + tests)
#   scripts/setup.sh --native   only what the native core, shell and tests need
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD

SUDO=""
if [ "$(id -u)" != 0 ]; then SUDO="sudo"; fi

native_pkgs=(cmake ninja-build g++ clang libclang-rt-14-dev doctest-dev nlohmann-json3-dev
  libcli11-dev libfmt-dev libsqlite3-dev python3-gsw python3-icalendar tzdata)  # tzdata: /usr/share/zoneinfo for --time-zone
web_pkgs=(emscripten libglfw3-dev fonts-dejavu-core chromium xvfb xauth dpkg-dev)

want=("${native_pkgs[@]}")
if [ "${1:-}" != "--native" ]; then want+=("${web_pkgs[@]}"); fi

missing=()
for p in "${want[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "setup: installing ${missing[*]}"
  $SUDO apt-get update -q
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -q --no-install-recommends "${missing[@]}"
fi

[ "${1:-}" = "--native" ] && exit 0

# Dear ImGui 1.86 sources from Debian's source package (the binary package has no sources
# usable for WebAssembly; toolchain.md). Cached under .cache/, which .gitignore excludes.
IMGUI_DIR="$ROOT/.cache/imgui"
if [ ! -f "$IMGUI_DIR/imgui.cpp" ]; then
  echo "setup: fetching Dear ImGui sources (apt-get source imgui)"
  if ! grep -rqs '^Types: deb deb-src' /etc/apt/sources.list.d/ && ! grep -qs '^deb-src' /etc/apt/sources.list; then
    $SUDO sed -i 's/^Types: deb$/Types: deb deb-src/' /etc/apt/sources.list.d/debian.sources
    $SUDO apt-get update -q
  fi
  tmp=$(mktemp -d)
  (cd "$tmp" && apt-get source -q imgui >/dev/null)
  src=$(find "$tmp" -maxdepth 1 -type d -name 'imgui-*' | head -n 1)
  mkdir -p "$ROOT/.cache"
  rm -rf "$IMGUI_DIR"
  mv "$src" "$IMGUI_DIR"
  rm -rf "$tmp"
fi

# playwright-core drives Debian's Chromium in the browser tests (never `playwright install`).
if [ ! -d "$ROOT/tests/browser/node_modules/playwright-core" ]; then
  echo "setup: installing playwright-core (npm)"
  (cd "$ROOT/tests/browser" && npm install --no-audit --no-fund --loglevel=error)
fi
