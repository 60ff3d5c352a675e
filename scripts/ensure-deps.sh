#!/usr/bin/env bash
# Installs the npm dependencies when node_modules is missing or older than the
# lock file. Sourced by start.sh and test.sh.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[deps] installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi
