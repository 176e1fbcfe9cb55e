#!/usr/bin/env bash
# Local PostgreSQL lifecycle on loopback, used only when DATABASE_URL is not set:
#   cluster.sh start [db…]     start (initialising or re-configuring as needed) and create the databases
#   cluster.sh stop | status
#   cluster.sh url [db] [--app] the owner's URL (migrations, the seed, tests), or with --app the app's
#   cluster.sh drop <db>       drop a database (as the cluster's superuser)
# Idempotent: start reuses a running cluster.
#
# Security: password (scram-sha-256) authentication on 127.0.0.1 and ::1 only, no Unix socket. Three
# roles, each with a generated password kept 0600 beside the cluster (pg-<role>.password):
#   postgres        the cluster's superuser, used by this script alone;
#   tapwright       owns the databases and the schema; migrations and the seed run as it;
#   tapwright_app   what the web app and the sidecar connect as: it owns nothing and is granted only
#                   what the app does (migrations/run.ts grants it after migrating).
# A cluster made by an older version of this script (trust authentication, databases owned by
# postgres) is re-configured on start: new pg_hba.conf, passwords set in single-user mode while the
# server is stopped, databases and their objects handed to the owner role.
set -euo pipefail
ROOT=$(cd "$(dirname "$0")/.." && pwd)
PORT=${PG_PORT:-5433}
OWNER=tapwright
APP=tapwright_app
HBA_MARK="# tapwright: scram-sha-256 on loopback (written by db/cluster.sh)"
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

DATA=$(resolve_dir)
# The passwords live beside the cluster (in .data, or in /tmp/tapwright-pg-<port> when postgres
# cannot reach the checkout), so every checkout that uses this cluster finds them.
SECRETS=$(dirname "$DATA")

running() { [ -n "$BIN" ] && as_pg "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; }
# Whether something already accepts connections on the cluster's port (another cluster, another program).
port_taken() { (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null; }
password_file() { echo "$SECRETS/pg-$1.password"; }
password() {
  local f
  f=$(password_file "$1")
  [ -s "$f" ] || { echo "No password for role $1 in $f: run bash db/cluster.sh start first." >&2; exit 1; }
  cat "$f"
}
url() { echo "postgres://$1:$(password "$1")@127.0.0.1:$PORT/$2"; }
admin_psql() { PGPASSWORD=$(password postgres) psql -h 127.0.0.1 -p "$PORT" -U postgres -v ON_ERROR_STOP=1 -qtA "$@"; }

# 256-bit passwords of URL-safe characters, written 0600 only when missing.
ensure_passwords() {
  local role f
  for role in postgres "$OWNER" "$APP"; do
    f=$(password_file "$role")
    [ -s "$f" ] && continue
    (umask 077 && head -c 32 /dev/urandom | base64 | tr '+/' '-_' | tr -d '=\n' >"$f")
  done
  chmod 600 "$SECRETS"/pg-*.password
}

configured() {
  local role
  for role in postgres "$OWNER" "$APP"; do [ -s "$(password_file "$role")" ] || return 1; done
  as_pg grep -qxF "$HBA_MARK" "$DATA/pg_hba.conf"
}

# Passwords and roles are set in single-user mode, with the server stopped: no window in which the
# cluster accepts connections without a password. Each statement is one line (single-user mode).
configure() {
  running && as_pg "$BIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null
  ensure_passwords
  printf '%s\nhost all all 127.0.0.1/32 scram-sha-256\nhost all all ::1/128 scram-sha-256\n' "$HBA_MARK" \
    | as_pg tee "$DATA/pg_hba.conf" >/dev/null
  {
    echo "SET password_encryption = 'scram-sha-256';"
    echo "ALTER ROLE postgres WITH PASSWORD '$(password postgres)';"
    echo "DO \$\$ BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$OWNER') THEN CREATE ROLE $OWNER; END IF; END \$\$;"
    echo "DO \$\$ BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$APP') THEN CREATE ROLE $APP; END IF; END \$\$;"
    echo "ALTER ROLE $OWNER WITH LOGIN CREATEDB NOSUPERUSER NOCREATEROLE NOREPLICATION NOBYPASSRLS PASSWORD '$(password "$OWNER")';"
    echo "ALTER ROLE $APP WITH LOGIN NOCREATEDB NOSUPERUSER NOCREATEROLE NOREPLICATION NOBYPASSRLS NOINHERIT PASSWORD '$(password "$APP")';"
  } | as_pg "$BIN/postgres" --single -D "$DATA" -c listen_addresses='' template1 >/dev/null 2>"$SECRETS/pg-configure.log"
  if grep -q "ERROR" "$SECRETS/pg-configure.log"; then
    echo "Configuring the PostgreSQL roles failed:" >&2
    grep "ERROR" "$SECRETS/pg-configure.log" >&2
    exit 1
  fi
  rm -f "$SECRETS/pg-configure.log"
}

# A database owned by the owner role; one left by an older version (owned by postgres) is handed
# over with everything in its public schema.
ensure_database() {
  local db=$1 owner
  owner=$(admin_psql -d postgres -c "select pg_get_userbyid(datdba) from pg_database where datname = '$db'")
  if [ -z "$owner" ]; then
    admin_psql -d postgres -c "create database \"$db\" owner $OWNER" >/dev/null
    return
  fi
  [ "$owner" = "$OWNER" ] && return
  echo "Handing database $db to the $OWNER role"
  admin_psql -d postgres -c "alter database \"$db\" owner to $OWNER" >/dev/null
  admin_psql -d "$db" >/dev/null <<SQL
alter schema public owner to $OWNER;
do \$\$
declare r record;
begin
  -- Tables, views and sequences not tied to a column (ALTER TABLE moves a table's own sequences with it).
  for r in
    select c.oid::regclass as name from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where n.nspname = 'public' and c.relkind in ('r', 'p', 'v', 'm', 'f', 'S')
      and pg_get_userbyid(c.relowner) <> '$OWNER'
      and not exists (select 1 from pg_depend d where d.objid = c.oid and d.classid = 'pg_class'::regclass and d.deptype in ('a', 'i'))
  loop
    execute format('alter table %s owner to $OWNER', r.name);
  end loop;
  for r in
    select p.oid::regprocedure as name from pg_proc p join pg_namespace n on n.oid = p.pronamespace
    where n.nspname = 'public' and pg_get_userbyid(p.proowner) <> '$OWNER'
  loop
    execute format('alter routine %s owner to $OWNER', r.name);
  end loop;
  for r in
    select t.oid::regtype as name from pg_type t join pg_namespace n on n.oid = t.typnamespace
    where n.nspname = 'public' and t.typtype in ('e', 'd') and pg_get_userbyid(t.typowner) <> '$OWNER'
  loop
    execute format('alter type %s owner to $OWNER', r.name);
  end loop;
end \$\$;
SQL
}

case "${1:-}" in
  start)
    ensure_installed
    mkdir -p "$DATA"
    if [ "$(id -u)" = 0 ]; then
      # postgres owns the cluster directory only; the passwords beside it stay root's (0600), and
      # .data is root's and only traversable by others (older versions gave all of .data to postgres).
      chown postgres:postgres "$DATA"
      if [ "$SECRETS" = "$ROOT/.data" ]; then
        chown root:root "$SECRETS"
        chmod 711 "$SECRETS"
      else
        chown postgres:postgres "$SECRETS"
        chmod 711 "$SECRETS"
      fi
    else
      chmod 700 "$SECRETS"
    fi
    if ! as_pg test -s "$DATA/PG_VERSION"; then
      # The server never runs with this pg_hba.conf: configure() replaces it before the first start.
      as_pg "$BIN/initdb" -D "$DATA" -U postgres -A trust -E UTF8 --locale=C.UTF-8 --no-sync >/dev/null
    fi
    configured || configure
    if ! running; then
      if port_taken; then
        echo "PostgreSQL cannot start: another server already listens on 127.0.0.1:$PORT. Stop it, or choose a free port: PG_PORT=$((PORT + 1)) npm start (log: $DATA/server.log)" >&2
        exit 1
      fi
      # No Unix socket anywhere: a socket file inside the tree breaks the CSS build's file scan.
      if ! as_pg "$BIN/pg_ctl" -D "$DATA" -l "$DATA/server.log" -w -t 30 \
        -o "-c listen_addresses=127.0.0.1 -p $PORT -c unix_socket_directories='' -c fsync=off -c password_encryption=scram-sha-256" start >/dev/null 2>&1; then
        why=$(grep -E 'FATAL|ERROR' "$DATA/server.log" 2>/dev/null | tail -n 1 | sed -E 's/^.*(FATAL|ERROR): +//')
        echo "PostgreSQL could not start on 127.0.0.1:$PORT: ${why:-see its log}. If the port is the problem, choose another: PG_PORT=$((PORT + 1)) npm start (log: $DATA/server.log)" >&2
        exit 1
      fi
    fi
    for db in "${@:2}"; do ensure_database "$db"; done
    echo "PostgreSQL running on 127.0.0.1:$PORT (data in $DATA, password authentication)"
    ;;
  stop)
    if running; then as_pg "$BIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null; echo "PostgreSQL stopped"; fi
    ;;
  status)
    if running; then echo "running on 127.0.0.1:$PORT"; else echo "stopped"; exit 3; fi
    ;;
  url)
    db=tapwright; role=$OWNER
    for a in "${@:2}"; do case "$a" in --app) role=$APP ;; *) db=$a ;; esac; done
    url "$role" "$db"
    ;;
  drop)
    [ -n "${2:-}" ] || { echo "usage: db/cluster.sh drop <db>" >&2; exit 2; }
    admin_psql -d postgres -c "drop database if exists \"$2\" with (force)" >/dev/null
    ;;
  *)
    echo "usage: db/cluster.sh start [db…] | stop | status | url [db] [--app] | drop <db>" >&2; exit 2 ;;
esac
