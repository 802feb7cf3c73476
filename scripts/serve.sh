#!/usr/bin/env bash
# Builds the Tidewright app and serves it on http://127.0.0.1:${PORT:-8080}/ with the demo
# systems loaded on first start. Installs what is missing first (scripts/setup.sh).
set -euo pipefail
cd "$(dirname "$0")/.."
PORT=${PORT:-8080}
scripts/setup.sh
scripts/build-web.sh
echo "Tidewright is served at http://127.0.0.1:${PORT}/  (Ctrl-C stops it)"
exec node tests/browser/serve.mjs build/web/site "$PORT"
