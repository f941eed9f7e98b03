#!/usr/bin/env bash
# One command on a fresh machine: install what is missing, start the local stand-ins on test ports,
# build the client, run every test, print "N passed, N failed", stop everything.
set -uo pipefail
HERE="$(cd "$(dirname "$0")" && pwd)"
export PROFILE=test
source "$HERE/env.sh"
cd "$ROOT"
bash "$HERE/packages.sh" || exit 1
bash "$HERE/npm.sh" || exit 1
export NODE_ENV=test LOG_LEVEL="${LOG_LEVEL:-warn}" PG_FSYNC=off
# Stop on exit only what this run started (a developer's running test services are left alone).
started=0
if ! (echo > "/dev/tcp/127.0.0.1/$PGPORT") 2>/dev/null; then started=1; fi
cleanup() { [ "$started" = 1 ] && bash "$HERE/services.sh" stop >/dev/null 2>&1 || true; }
trap cleanup EXIT
bash "$HERE/services.sh" start || exit 1
# Each run starts with an empty mailbox in the SMTP fake (it keeps mail across restarts), so the tests
# that read every mail of the run read only this run's.
node -e 'fetch(process.argv[1] + "/messages", { method: "DELETE" }).catch(() => process.exit(1))' "$MAIL_CAPTURE_URL" || exit 1
# The strict type check counts as one test in the closing line.
echo "[sigmaline] type check (strict TypeScript over client, server, shared code and tests)"
typecheck=0
npx tsc --noEmit -p tsconfig.json || typecheck=1
# The lint and format gates (ESLint with the import boundaries of eslint.config.js; Prettier) count with it.
echo "[sigmaline] lint (typescript-eslint, React hooks, import boundaries)"
npx eslint . --max-warnings 0 || typecheck=1
# The format gate (Prettier, 120 columns, .prettierrc.json; data and generated files in .prettierignore).
echo "[sigmaline] format (Prettier --check)"
npx prettier --check . --log-level warn || typecheck=1
echo "[sigmaline] building the client"
NODE_ENV=production npx vite build --logLevel error || exit 1
mkdir -p "$LOCAL_DIR"
REPORT="$LOCAL_DIR/vitest-report.json"
rm -f "$REPORT"
npx vitest run --reporter=default --reporter=json --outputFile.json="$REPORT" "$@"
status=$?
[ "$typecheck" = 1 ] && { echo "[sigmaline] the type check or the lint gate failed (see above)"; status=1; }
if [ -f "$REPORT" ]; then
  node -e '
    const r = JSON.parse(require("fs").readFileSync(process.argv[1], "utf8"));
    const failedFiles = r.testResults.filter((f) => f.status === "failed" && f.assertionResults.every((a) => a.status !== "failed")).length;
    const tc = Number(process.argv[2]);
    console.log(`${r.numPassedTests + 1 - tc} passed, ${r.numFailedTests + failedFiles + tc} failed, ${r.numPendingTests + r.numTodoTests} skipped`);
  ' "$REPORT" "$typecheck"
else
  echo "0 passed, 1 failed"
fi
exit $status
