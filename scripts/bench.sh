#!/usr/bin/env bash
# Prints Tidewright's speed and size figures (benchmarks are not part of the test suite).
#   native benchmarks (g++ -O2 Release; bench_store builds a farm-sized journal database in
#   a temporary directory and needs about 1.3 GB of memory for its JSON-file comparison), the
#   solver benchmark again in WebAssembly under
#   Node.js with the WebAssembly/native ratio, and the app's transfer size and frame times.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD
JOBS=${TW_JOBS:-$(nproc)}
export NODE_PATH=/usr/share/nodejs
scripts/setup.sh

cmake -S . -B build/native -G Ninja -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_COMPILER=g++ >/dev/null
ninja -C build/native -j"$JOBS"
emcmake cmake -S . -B build/wasm -G Ninja -DCMAKE_BUILD_TYPE=Release >/dev/null
ninja -C build/wasm -j"$JOBS" bench_solver

echo "=== solver, native ==="
build/native/tests/bench_solver | tee build/bench_solver_native.txt
echo "=== solver, WebAssembly (Node.js) ==="
node --no-experimental-fetch build/wasm/tests/bench_solver.js | tee build/bench_solver_wasm.txt
# Ratio of every "<name>: <x> M solves/s (... per CPU second: <y> M solves/s" line, native
# over WebAssembly, once for wall time and once for process CPU time (the fair one on a
# shared machine). Target (issue 2): WebAssembly within 1.5x of native.
python3 - <<'PY'
import re
def read(p):
    out = {}
    for line in open(p):
        m = re.match(r"\s*(.+?):\s*([0-9.]+)\s*M solves/s.*per CPU second:\s*([0-9.]+)", line)
        if m: out[m.group(1)] = (float(m.group(2)), float(m.group(3)))
    return out
n, w = read("build/bench_solver_native.txt"), read("build/bench_solver_wasm.txt")
for k in n:
    if k in w and w[k][0] > 0 and w[k][1] > 0:
        print(f"ratio native/wasm {k}: wall {n[k][0]/w[k][0]:.2f}x, CPU {n[k][1]/w[k][1]:.2f}x"
              " (1.00x = same speed; target <= 1.5x)")
PY
for b in build/native/tests/bench_*; do
  case "$(basename "$b")" in
    bench_solver|bench_batch_floor) continue ;;  # solver above; the floor is run by bench_batch
  esac
  [ -x "$b" ] || continue
  echo "=== $(basename "$b") ==="
  # bench_batch: chem --batch rows/s and peak memory at 1e5, 1e6, 1e7 rows vs its floor
  # program (issue 16 goals: <= 2.5x the floor per core, < 64 MB). Figures only, never fails.
  "$b" || echo "($(basename "$b") exited with status $?)"
done
if [ -f tests/browser/bench.mjs ]; then
  scripts/build-web.sh
  echo "=== app in headless Chromium ==="
  (cd tests/browser && node bench.mjs "$ROOT/build/web/site")
fi
