#!/usr/bin/env bash
# Local PostgreSQL lifecycle on loopback: cluster.sh start|stop|status|url [dbname]
# Used only when DATABASE_URL is not set. Idempotent: start reuses a running cluster.
set -euo pipefail
ROOT=$(cd "$(dirname "$0")/.." && pwd)
PORT=${PG_PORT:-5433}
BIN=""
for v in 17 16 15; do [ -x "/usr/lib/postgresql/$v/bin/pg_ctl" ] && { BIN=/usr/lib/postgresql/$v/bin; break; }; done

as_pg() {
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# One resolver for every subcommand, so stop and status find what start started.
resolve_dir() {
  local d="$ROOT/.data/pg"
  if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$ROOT" 2>/dev/null; then
    d="/tmp/tapwright-pg-$PORT/pg"
  fi
  echo "$d"
}

ensure_installed() {
  [ -n "$BIN" ] && return 0
  if [ "$(id -u)" = 0 ]; then
    echo "Installing Debian's postgresql…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
    for v in 17 16 15; do [ -x "/usr/lib/postgresql/$v/bin/pg_ctl" ] && { BIN=/usr/lib/postgresql/$v/bin; break; }; done
  else
    echo "PostgreSQL is not installed. Run as root: apt-get update && apt-get install -y postgresql" >&2
    exit 1
  fi
}

running() { [ -n "$BIN" ] && as_pg "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; }

DATA=$(resolve_dir)
case "${1:-}" in
  start)
    ensure_installed
    mkdir -p "$DATA"
    [ "$(id -u)" = 0 ] && chown -R postgres:postgres "$(dirname "$DATA")"
    if [ ! -s "$DATA/PG_VERSION" ]; then
      as_pg "$BIN/initdb" -D "$DATA" -U postgres -A trust -E UTF8 --locale=C.UTF-8 --no-sync >/dev/null
    fi
    if ! running; then
      # No Unix socket anywhere: a socket file inside the tree breaks the CSS build's file scan.
      as_pg "$BIN/pg_ctl" -D "$DATA" -l "$DATA/server.log" -w -t 30 \
        -o "-c listen_addresses=127.0.0.1 -p $PORT -c unix_socket_directories='' -c fsync=off" start >/dev/null
    fi
    for db in "${@:2}"; do
      psql -h 127.0.0.1 -p "$PORT" -U postgres -tAc "select 1 from pg_database where datname='$db'" | grep -q 1 \
        || psql -h 127.0.0.1 -p "$PORT" -U postgres -qc "create database \"$db\"" >/dev/null
    done
    echo "PostgreSQL running on 127.0.0.1:$PORT (data in $DATA)"
    ;;
  stop)
    if running; then as_pg "$BIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null; echo "PostgreSQL stopped"; fi
    ;;
  status)
    if running; then echo "running on 127.0.0.1:$PORT"; else echo "stopped"; exit 3; fi
    ;;
  url)
    echo "postgres://postgres@127.0.0.1:$PORT/${2:-tapwright}"
    ;;
  *)
    echo "usage: db/cluster.sh start [db…] | stop | status | url [db]" >&2; exit 2 ;;
esac
