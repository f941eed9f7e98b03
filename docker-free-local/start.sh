#!/usr/bin/env bash
# One command on a fresh machine: install what is missing, start PostgreSQL, the S3 fake and the
# SMTP fake on loopback, migrate, build the client, seed the demo cruise, and serve the app on
# http://127.0.0.1:3000 (with an ingest worker in the same process). Ctrl-C stops everything.
set -euo pipefail
HERE="$(cd "$(dirname "$0")" && pwd)"
export PROFILE=dev
source "$HERE/env.sh"
cd "$ROOT"
bash "$HERE/packages.sh"
bash "$HERE/npm.sh"
export NODE_ENV=development
cleanup() { [ -n "${SERVER_PID:-}" ] && kill "$SERVER_PID" 2>/dev/null; wait 2>/dev/null; bash "$HERE/services.sh" stop; }
trap cleanup EXIT INT TERM
bash "$HERE/services.sh" start
npx tsx server/migrate.ts
echo "[sigmaline] building the client"
NODE_ENV=production npx vite build --logLevel error
RUN_WORKER_IN_PROCESS=true npx tsx server/index.ts &
SERVER_PID=$!
for _ in $(seq 1 100); do curl -sf "http://127.0.0.1:$PORT/api/health" >/dev/null && break; sleep 0.3; done
echo "[sigmaline] seeding the demo cruise (casts go through the intake pipeline)"
npx tsx server/seed.ts
cat <<MSG

  Sigmaline is running on http://127.0.0.1:$PORT

  Demo accounts (password: sigmaline-demo)
    chief@sigmaline.test    chief scientist of the demo cruise
    tech@sigmaline.test     technician
    analyst@sigmaline.test  analyst
    pi@sigmaline.test       principal investigator
    admin@sigmaline.test    site admin (sees the captured mail at /admin/mail)

  Press Ctrl-C to stop the app and the local services.
MSG
wait "$SERVER_PID"
