#!/usr/bin/env bash
# npm ci when node_modules is missing or older than the lock file.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[sigmaline] npm ci"
  npm ci --no-audit --no-fund --loglevel=error
fi
