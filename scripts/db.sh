#!/usr/bin/env bash
# The project's own PostgreSQL: installed from Debian's packages when missing,
# one cluster in a project-local folder, run as the unprivileged `postgres`
# user on 127.0.0.1. Idempotent; never hangs (every wait has a limit).
#
#   bash scripts/db.sh start    install if needed, init once, start, create the database
#   bash scripts/db.sh stop     stop the project's server
#   bash scripts/db.sh status   say whether it runs and where
#   bash scripts/db.sh url      print the DATABASE_URL of the local cluster
#   bash scripts/db.sh backup   pg_dump (custom format) into .data/backups/; the path is the last line
#   bash scripts/db.sh restore FILE   pg_restore --clean FILE into the project's database
#
# backup and restore work on DATABASE_URL when it is set, else on the local
# cluster's database (PG_DATABASE, default rootplate).
#
# PG_PORT picks the port; by default one derived from the checkout's folder
# (55500-56499, the same as defaultPgPort() in server/utils/db.ts), so two
# checkouts on one machine never share a cluster by accident. `start` exits 0 and prints
# "started" when it started the server, "running" when it already ran.
set -euo pipefail

ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
default_port() {
  local hex
  hex=$(printf '%s' "$ROOT" | md5sum | cut -c1-4)
  echo $((55500 + 16#$hex % 1000))
}
PG_PORT=${PG_PORT:-$(default_port)}
DB_NAME=${PG_DATABASE:-rootplate}
DATA_ROOT="$ROOT/.data"

die() { echo "db: $*" >&2; exit 1; }
note() { echo "db: $*" >&2; }

is_root() { [ "$(id -u)" = 0 ]; }

# From /, since the postgres user may not be allowed into the current folder.
as_pg() {
  if is_root; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

find_bin() {
  local d
  d=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  [ -n "$d" ] && [ -x "$d/pg_ctl" ] && echo "$d"
}

install_server() {
  is_root || die "PostgreSQL is not installed and this user cannot install it. As root: apt-get install -y --no-install-recommends postgresql"
  note "installing PostgreSQL from Debian's packages (once)..."
  export DEBIAN_FRONTEND=noninteractive
  timeout 600 apt-get update -qq >/dev/null || die "apt-get update failed; is the package mirror reachable?"
  timeout 900 apt-get install -y -qq --no-install-recommends postgresql >/dev/null \
    || die "apt-get install postgresql failed"
  # Debian starts its own cluster on 5432; ours is separate and needs none of it.
  if command -v pg_ctlcluster >/dev/null 2>&1; then
    pg_ctlcluster --mode fast "$(ls /usr/lib/postgresql | sort -V | tail -n 1)" main stop >/dev/null 2>&1 || true
  fi
}

# The data folder must be reachable by the postgres user: a project under a
# private home folder is not, so fall back to /var/tmp and say so.
pick_pgdata() {
  mkdir -p "$DATA_ROOT"
  local inside="$DATA_ROOT/pg"
  if ! is_root; then echo "$inside"; return; fi
  if runuser -u postgres -- test -x "$DATA_ROOT" 2>/dev/null; then
    echo "$inside"
  else
    local tag
    tag=$(printf '%s' "$ROOT" | md5sum | cut -c1-10)
    echo "/var/tmp/rootplate-pg-$tag"
  fi
}

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

pg_running() {
  [ -f "$PGDATA/postmaster.pid" ] && as_pg "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1
}

running_port() {
  sed -n '4p' "$PGDATA/postmaster.pid" 2>/dev/null || true
}

ensure_database() {
  local exists
  exists=$("$PGBIN/psql" -X -h 127.0.0.1 -p "$PG_PORT" -U postgres -d postgres -Atc \
    "select 1 from pg_database where datname = '$DB_NAME'" 2>&1) || die "cannot reach the server on port $PG_PORT: $exists"
  if [ "$exists" != 1 ]; then
    "$PGBIN/psql" -X -q -h 127.0.0.1 -p "$PG_PORT" -U postgres -d postgres -c "create database \"$DB_NAME\"" >/dev/null \
      || die "could not create database $DB_NAME"
  fi
}

cmd_start() {
  PGBIN=$(find_bin || true)
  [ -n "$PGBIN" ] || { install_server; PGBIN=$(find_bin || true); }
  [ -n "$PGBIN" ] || die "PostgreSQL binaries not found under /usr/lib/postgresql after install"
  PGDATA=$(pick_pgdata)
  [ "$PGDATA" = "$DATA_ROOT/pg" ] || note "the project folder is not reachable by the postgres user; using $PGDATA"

  mkdir -p "$DATA_ROOT"
  exec 9>"$DATA_ROOT/db.lock"
  timeout 120 flock 9 || die "another start has held the database lock for 2 minutes; giving up"

  if pg_running; then
    local p
    p=$(running_port)
    [ "$p" = "$PG_PORT" ] || die "the project's server already runs on port $p, not $PG_PORT; run 'npm run db:stop' or set PG_PORT=$p"
    ensure_database
    echo running
    return
  fi

  local avail
  avail=$(df -Pk "$(dirname "$PGDATA")" | awk 'NR==2 {print $4}')
  [ "${avail:-0}" -gt 204800 ] || die "less than 200 MB free on $(dirname "$PGDATA"); free some space"

  if [ ! -f "$PGDATA/PG_VERSION" ]; then
    note "creating the project's cluster in $PGDATA (once)"
    mkdir -p "$PGDATA"
    if is_root; then chown postgres:postgres "$PGDATA"; fi
    chmod 700 "$PGDATA"
    # Trust is acceptable only because the server listens on 127.0.0.1 and on
    # a socket inside its own data folder.
    as_pg "$PGBIN/initdb" -D "$PGDATA" -U postgres --auth=trust -E UTF8 --no-locale >"$DATA_ROOT/initdb.log" 2>&1 \
      || die "initdb failed (no permission or no space?): see $DATA_ROOT/initdb.log"
  fi

  if port_in_use "$PG_PORT"; then
    die "port $PG_PORT on 127.0.0.1 is taken by another program; set PG_PORT to a free port"
  fi

  # Close the lock descriptor for the server, or it would hold the lock for life.
  if ! as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -l "$PGDATA/server.log" -w -t 60 \
      -o "-p $PG_PORT -h 127.0.0.1 -k $PGDATA -c fsync=on" start >/dev/null 9>&-; then
    tail -n 15 "$PGDATA/server.log" >&2 2>/dev/null || true
    die "the server did not start within 60 s (log above: port, disk or permission)"
  fi
  ensure_database
  note "PostgreSQL for this checkout listens on 127.0.0.1:$PG_PORT (PG_PORT overrides)"
  echo started
}

cmd_stop() {
  PGBIN=$(find_bin || true)
  [ -n "$PGBIN" ] || { note "PostgreSQL is not installed; nothing to stop"; return; }
  PGDATA=$(pick_pgdata)
  if pg_running; then
    as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -m fast -w -t 60 stop >/dev/null
    note "stopped"
  else
    note "not running"
  fi
}

cmd_status() {
  PGBIN=$(find_bin || true)
  [ -n "$PGBIN" ] || { echo "not installed"; return; }
  PGDATA=$(pick_pgdata)
  if pg_running; then echo "running on 127.0.0.1:$(running_port), data in $PGDATA"; else echo "stopped, data in $PGDATA"; fi
}

target_url() {
  if [ -n "${DATABASE_URL:-}" ]; then echo "$DATABASE_URL"; else echo "postgres://postgres@127.0.0.1:$PG_PORT/$DB_NAME"; fi
}

need_client() {
  PGBIN=$(find_bin || true)
  [ -n "$PGBIN" ] || die "PostgreSQL's client programs are not installed; run 'npm run db:start' once (it installs them)"
}

cmd_backup() {
  need_client
  local dir="$DATA_ROOT/backups" url file
  url=$(target_url)
  mkdir -p "$dir"
  file="$dir/rootplate-$(date -u +%Y%m%d-%H%M%S)-$$.dump"
  # Custom format: compressed, and pg_restore can pick from it or clean first.
  "$PGBIN/pg_dump" --format=custom --no-owner --file="$file.partial" --dbname="$url" \
    || { rm -f "$file.partial"; die "pg_dump failed: is the database running? ('npm run db:start')"; }
  mv "$file.partial" "$file"
  note "backup of $(printf '%s' "$url" | sed -E 's#//[^@]*@#//#') written ($(du -h "$file" | cut -f1))"
  echo "$file"
}

cmd_restore() {
  need_client
  local file=${1:-}
  [ -n "$file" ] || die "usage: npm run db:restore -- FILE (a file written by npm run db:backup)"
  [ -f "$file" ] || die "no such backup file: $file"
  "$PGBIN/pg_restore" --list "$file" >/dev/null 2>&1 || die "$file is not a backup in pg_dump's custom format"
  if [ -z "${DATABASE_URL:-}" ]; then ensure_database; fi
  local url
  url=$(target_url)
  # One transaction: a restore that fails half-way leaves the database as it was.
  "$PGBIN/pg_restore" --clean --if-exists --no-owner --single-transaction --exit-on-error --dbname="$url" "$file" \
    || die "pg_restore failed; the database was left as it was"
  note "restored $file into $(printf '%s' "$url" | sed -E 's#//[^@]*@#//#')"
  echo restored
}

case "${1:-start}" in
  start) cmd_start ;;
  stop) cmd_stop ;;
  status) cmd_status ;;
  url) echo "postgres://postgres@127.0.0.1:$PG_PORT/$DB_NAME" ;;
  backup) cmd_backup ;;
  restore) cmd_restore "${2:-}" ;;
  *) die "usage: db.sh start|stop|status|url|backup|restore FILE" ;;
esac
