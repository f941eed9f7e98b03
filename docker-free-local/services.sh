#!/usr/bin/env bash
# start | stop | stop-s3 | start-s3 — PostgreSQL, the S3 fake and the SMTP fake, with pid files,
# so that stop leaves no stray process.
set -euo pipefail
HERE="$(cd "$(dirname "$0")" && pwd)"
source "$HERE/env.sh"
RUN="$LOCAL_DIR/run"; mkdir -p "$RUN"
TSX="$ROOT/node_modules/.bin/tsx"

wait_port() { for _ in $(seq 1 100); do (echo > "/dev/tcp/127.0.0.1/$1") 2>/dev/null && return 0; sleep 0.1; done; echo "port $1 did not open" >&2; return 1; }
start_one() { # name script port
  local name=$1 script=$2 port=$3
  if [ -f "$RUN/$name.pid" ] && kill -0 "$(cat "$RUN/$name.pid")" 2>/dev/null; then return 0; fi
  nohup "$TSX" "$HERE/$script" > "$RUN/$name.log" 2>&1 &
  echo $! > "$RUN/$name.pid"
  wait_port "$port"
}
stop_one() {
  local name=$1
  if [ -f "$RUN/$name.pid" ]; then
    local pid; pid=$(cat "$RUN/$name.pid")
    if kill -0 "$pid" 2>/dev/null; then
      pkill -TERM -P "$pid" 2>/dev/null || true; kill -TERM "$pid" 2>/dev/null || true
      for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
      kill -KILL "$pid" 2>/dev/null || true
    fi
    rm -f "$RUN/$name.pid"
  fi
}
case "${1:-start}" in
  start)
    bash "$HERE/pg.sh" start
    start_one s3 s3.ts "$S3_PORT"; echo "[sigmaline] S3 fake on $S3_ENDPOINT"
    start_one smtp smtp.ts "$MAIL_HTTP_PORT"; echo "[sigmaline] SMTP fake on $SMTP_URL"
    ;;
  start-s3) start_one s3 s3.ts "$S3_PORT";;
  stop-s3) stop_one s3;;
  stop)
    stop_one smtp; stop_one s3; bash "$HERE/pg.sh" stop
    ;;
  *) echo "usage: services.sh start|stop|start-s3|stop-s3" >&2; exit 2;;
esac
