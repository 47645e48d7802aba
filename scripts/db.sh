#!/usr/bin/env bash
# The project's own PostgreSQL: installs Debian's package when missing, keeps a cluster in .data/pg
# run by the unprivileged postgres user on 127.0.0.1:54329, and creates the role and databases.
# Idempotent: a second run only makes sure it is running.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

PGDATA_DIR="$DATA_DIR/pg"
SOCKET_DIR="$DATA_DIR/pg-run"
DB_ROLE=trimwire
DB_PASSWORD=trimwire
DATABASES=(trimwire_dev trimwire_test)

pg_bin_dir() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }

# PostgreSQL refuses to run as root: run its tools as postgres when we are root.
as_pg() {
  if [ "$(id -u)" -eq 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

BIN="$(pg_bin_dir)"
if [ -z "$BIN" ] || [ ! -x "$BIN/initdb" ]; then
  info "installing Debian's postgresql"
  [ "$(id -u)" -eq 0 ] || fail "PostgreSQL is not installed and this is not root."
  # Debian would otherwise create and start its own cluster on port 5432.
  mkdir -p /etc/postgresql-common
  echo 'create_main_cluster = false' >/etc/postgresql-common/createcluster.conf
  ensure_apt_packages postgresql
  BIN="$(pg_bin_dir)"
  [ -n "$BIN" ] && [ -x "$BIN/initdb" ] || fail "initdb not found after installing postgresql"
fi

mkdir -p "$PGDATA_DIR" "$SOCKET_DIR"
if [ "$(id -u)" -eq 0 ]; then
  id postgres >/dev/null 2>&1 || fail "the postgres system user is missing"
  chown postgres:postgres "$PGDATA_DIR" "$SOCKET_DIR"
  chmod 700 "$PGDATA_DIR"
  # Every folder above the data dir must be traversable by postgres.
  dir="$DATA_DIR"
  while [ "$dir" != "/" ]; do
    if ! runuser -u postgres -- test -x "$dir"; then chmod o+x "$dir"; fi
    dir="$(dirname "$dir")"
  done
fi
[ "${#SOCKET_DIR}" -lt 100 ] || fail "socket path too long for PostgreSQL: $SOCKET_DIR (move the project to a shorter path)"

if [ ! -f "$PGDATA_DIR/PG_VERSION" ]; then
  info "initdb .data/pg"
  pwfile="$(mktemp)"
  echo "postgres-local-only-$RANDOM$RANDOM" >"$pwfile"
  chmod 644 "$pwfile"
  as_pg "$BIN/initdb" -D "$PGDATA_DIR" -U postgres --pwfile="$pwfile" -E UTF8 --locale=C.UTF-8 \
    --auth-local=trust --auth-host=scram-sha-256 >"$DATA_DIR/initdb.log" 2>&1 \
    || { rm -f "$pwfile"; cat "$DATA_DIR/initdb.log" >&2; fail "initdb failed"; }
  rm -f "$pwfile"
  cat >>"$PGDATA_DIR/postgresql.conf" <<CONF

# Trimwire local cluster (scripts/db.sh)
listen_addresses = '127.0.0.1'
port = $PG_PORT
unix_socket_directories = '$SOCKET_DIR'
max_connections = 100
CONF
fi

if as_pg "$BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
  info "PostgreSQL already running on 127.0.0.1:$PG_PORT"
else
  info "starting PostgreSQL on 127.0.0.1:$PG_PORT (log: .data/pg.log)"
  touch "$DATA_DIR/pg.log"
  [ "$(id -u)" -eq 0 ] && chown postgres:postgres "$DATA_DIR/pg.log"
  # setsid: the server must outlive this script's process group.
  as_pg setsid "$BIN/pg_ctl" -D "$PGDATA_DIR" -l "$DATA_DIR/pg.log" -w -t 60 start >/dev/null \
    || { tail -n 30 "$DATA_DIR/pg.log" >&2; fail "PostgreSQL did not start"; }
fi

psql_admin() { as_pg "$BIN/psql" -h "$SOCKET_DIR" -p "$PG_PORT" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA "$@"; }

if [ "$(psql_admin -c "SELECT 1 FROM pg_roles WHERE rolname = '$DB_ROLE'")" != "1" ]; then
  info "creating role $DB_ROLE"
  psql_admin -c "CREATE ROLE $DB_ROLE LOGIN PASSWORD '$DB_PASSWORD'"
fi
for db in "${DATABASES[@]}"; do
  if [ "$(psql_admin -c "SELECT 1 FROM pg_database WHERE datname = '$db'")" != "1" ]; then
    info "creating database $db"
    psql_admin -c "CREATE DATABASE $db OWNER $DB_ROLE"
  fi
done
