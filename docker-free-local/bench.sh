#!/usr/bin/env bash
# `npm run bench`: the benchmarks need the local stand-ins (test profile) and a built client.
set -uo pipefail
HERE="$(cd "$(dirname "$0")" && pwd)"
export PROFILE=test
source "$HERE/env.sh"
cd "$ROOT"
bash "$HERE/packages.sh" || exit 1
bash "$HERE/npm.sh" || exit 1
export NODE_ENV=test LOG_LEVEL="${LOG_LEVEL:-error}"
started=0
if ! (echo > "/dev/tcp/127.0.0.1/$PGPORT") 2>/dev/null; then bash "$HERE/services.sh" start || exit 1; started=1; fi
NODE_ENV=production npx vite build --logLevel error || exit 1
npx tsx tests/bench/run.ts "$@"
status=$?
[ "$started" = 1 ] && bash "$HERE/services.sh" stop
exit $status
