#!/usr/bin/env bash
# start | stop | create-db NAME — PostgreSQL 15 on 127.0.0.1:$PGPORT with a git-ignored data dir.
# PostgreSQL refuses to run as root, so the server runs as the Debian package's `postgres` user.
set -euo pipefail
source "$(dirname "$0")/env.sh"
as_pg() { if [ "$(id -u)" -eq 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }
psql_admin() { as_pg "$PG_BIN/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -v ON_ERROR_STOP=1 -qAt "$@"; }
case "${1:-start}" in
  start)
    mkdir -p "$PGDATA_DIR" "$PG_SOCKET_DIR"
    if [ "$(id -u)" -eq 0 ]; then chown postgres:postgres "$PGDATA_DIR" "$PG_SOCKET_DIR"; chmod 700 "$PGDATA_DIR"; fi
    if [ ! -f "$PGDATA_DIR/PG_VERSION" ]; then
      as_pg "$PG_BIN/initdb" -D "$PGDATA_DIR" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
    fi
    if ! as_pg "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
      as_pg "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" -w -t 60 -l "$PGDATA_DIR/server.log" \
        -o "-p $PGPORT -c listen_addresses=127.0.0.1 -k $PG_SOCKET_DIR -c max_connections=200 -c fsync=${PG_FSYNC:-on}" start >/dev/null
    fi
    psql_admin -c "DO \$\$BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname='sigmaline') THEN CREATE ROLE sigmaline LOGIN PASSWORD 'sigmaline' CREATEDB; END IF; END\$\$;"
    if [ "$(psql_admin -c "SELECT 1 FROM pg_database WHERE datname='$PG_DB'")" != "1" ]; then
      psql_admin -c "CREATE DATABASE $PG_DB OWNER sigmaline"
    fi
    echo "[sigmaline] PostgreSQL on 127.0.0.1:$PGPORT"
    ;;
  stop)
    if [ -f "$PGDATA_DIR/PG_VERSION" ] && as_pg "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
      as_pg "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" -m fast -w stop >/dev/null
    fi
    ;;
  restart)
    as_pg "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" -m fast -w restart >/dev/null
    ;;
  *) echo "usage: pg.sh start|stop|restart" >&2; exit 2;;
esac
