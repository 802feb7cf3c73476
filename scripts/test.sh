#!/usr/bin/env bash
# Builds and runs every Tidewright test. Installs what is missing first (scripts/setup.sh).
#   1. native g++ build: unit/check-value/property tests + outside-reference checks (python3-gsw,
#      python3-icalendar)
#   2. clang build with AddressSanitizer + UndefinedBehaviorSanitizer: the unit tests again
#   3. the core test suite compiled to WebAssembly, run under Node.js
#   4. libFuzzer targets, each for a bounded time (TW_FUZZ_SECONDS, default 30)
#   5. the app: browser build + browser tests in headless Chromium; native app start under Xvfb
# Stops at the first failing stage and exits non-zero.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD
JOBS=${TW_JOBS:-$(nproc)}
FUZZ_SECONDS=${TW_FUZZ_SECONDS:-30}
export NODE_PATH=/usr/share/nodejs   # acorn for Emscripten's JS optimizer (toolchain.md)

scripts/setup.sh

started=$SECONDS
stage() { printf '\n=== %s (at %d s) ===\n' "$*" $((SECONDS - started)); }
passed=0

stage "1/5 native build (g++) and tests"
# The native desktop app is configured here too, so stage 5 reuses this build's core.
cmake -S . -B build/native -G Ninja -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_COMPILER=g++ \
  -DTW_BUILD_WEB=ON -DTW_IMGUI_DIR="$ROOT/.cache/imgui" >/dev/null
ninja -C build/native -j"$JOBS"
ctest --test-dir build/native --output-on-failure -j"$JOBS"
passed=$((passed + 1))

stage "2/5 clang + AddressSanitizer + UndefinedBehaviorSanitizer"
# -O1 with line tables only, as the sanitizers' own docs suggest: the stack traces keep file and
# line, and the build takes about half the time of -O2 -g.
SANITIZER_FLAGS=(-DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_FLAGS_RELWITHDEBINFO="-O1 -gline-tables-only")
cmake -S . -B build/asan -G Ninja "${SANITIZER_FLAGS[@]}" -DCMAKE_CXX_COMPILER=clang++ \
  -DTW_SANITIZE=ON >/dev/null
ninja -C build/asan -j"$JOBS" tw_tests tidewright
ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 \
  ctest --test-dir build/asan --output-on-failure -j"$JOBS"
passed=$((passed + 1))

stage "3/5 core tests compiled to WebAssembly, under Node.js"
# In the browser app's own build directory: the tests run on the core exactly as the app is
# built (-Oz, link-time optimised), and stage 5 reuses its compiled core instead of building it
# a second time.
emcmake cmake -S . -B build/web -G Ninja -DCMAKE_BUILD_TYPE=Release -DTW_BUILD_WEB=ON -DTW_BUILD_TESTS=ON \
  -DTW_IMGUI_DIR="$ROOT/.cache/imgui" >/dev/null
ninja -C build/web -j"$JOBS" tw_tests
ctest --test-dir build/web --output-on-failure
passed=$((passed + 1))

stage "4/5 fuzz targets (${FUZZ_SECONDS} s each)"
cmake -S . -B build/fuzz -G Ninja "${SANITIZER_FLAGS[@]}" -DCMAKE_CXX_COMPILER=clang++ \
  -DTW_FUZZ=ON >/dev/null
ninja -C build/fuzz -j"$JOBS" $(cd tests/fuzz && ls *.cpp 2>/dev/null | sed 's/\.cpp$//')
for src in tests/fuzz/*.cpp; do
  [ -e "$src" ] || continue
  name=$(basename "$src" .cpp)
  corpus_seed="tests/fuzz/corpus_${name#fuzz_}"
  work=$(mktemp -d)
  [ -d "$corpus_seed" ] && cp -r "$corpus_seed"/. "$work"/
  echo "fuzz: $name for ${FUZZ_SECONDS} s"
  log="$work.log"
  # A finding's input goes to its own directory; on a failure the lines that say what went
  # wrong and the input itself (base64) are printed, so a CI log alone reproduces it.
  findings=$(mktemp -d)
  if ! "build/fuzz/tests/$name" -max_total_time="$FUZZ_SECONDS" -timeout=10 -rss_limit_mb=2048 \
      -print_final_stats=1 -artifact_prefix="$findings/" "$work" >"$log" 2>&1; then
    grep -E -m 20 "ERROR|SUMMARY|terminate called|what\(\)|runtime error| in tw::| in LLVMFuzzer" "$log" || true
    tail -n 12 "$log"
    for found in "$findings"/*; do
      [ -e "$found" ] || continue
      echo "fuzz: $name's input $(basename "$found") (base64; save it, base64 -d, and run the target on it):"
      head -c 8192 "$found" | base64 -w 100
    done
    exit 1
  fi
  tail -n 6 "$log"
  rm -rf "$work" "$log" "$findings"
done
passed=$((passed + 1))

stage "5/5 the app: browser build, browser tests, native start under Xvfb"
web_started=$SECONDS
scripts/build-web.sh
printf 'browser build: %d s\n' $((SECONDS - web_started))
# Each suite prints its own passes; the seconds each took are printed too, so the stage's
# time can be trimmed where it goes.
browser_suite() {
  local t0=$SECONDS
  (cd tests/browser && node "$@" "$ROOT/build/web/site")
  printf 'browser suite %s: %d s\n' "$1" $((SECONDS - t0))
}
browser_suite run-all.mjs
browser_suite test_screens_dosing.mjs
browser_suite test_log.mjs
TW_CLI="$ROOT/build/native/shell/tidewright" browser_suite test_schedules.mjs
TW_CLI="$ROOT/build/native/shell/tidewright" browser_suite test_pumps.mjs
browser_suite test_store.mjs
browser_suite test_serving.mjs
browser_suite test_saved_settings.mjs
browser_suite test_switcher.mjs
browser_suite test_farm.mjs
TW_CLI="$ROOT/build/native/shell/tidewright" browser_suite test_hatchery_water.mjs
TW_CLI="$ROOT/build/native/shell/tidewright" browser_suite test_import.mjs
xvfb-run -a build/native/web/tidewright-app --frames 30
passed=$((passed + 1))

printf '\nstages: %d passed, 0 failed, in %d s\n' "$passed" $((SECONDS - started))
