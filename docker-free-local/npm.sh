#!/usr/bin/env bash
# npm ci when node_modules is missing or older than the lock file. A node_modules that is a symbolic link
# (a second working tree sharing another checkout's install) is left alone: npm ci would empty its target.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -L node_modules ]; then exit 0; fi
if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[sigmaline] npm ci"
  npm ci --no-audit --no-fund --loglevel=error
fi
