#!/usr/bin/env bash
# Basted's own PostgreSQL on loopback, from Debian's package, with no systemd.
#   scripts/pg.sh install        apt-get install postgresql when no server binaries exist
#   scripts/pg.sh start          install + initdb (first time) + start; a second start is a no-op
#   scripts/pg.sh stop           fast, clean stop; a no-op when not running
#   scripts/pg.sh status
#   scripts/pg.sh psql [args]    psql as the superuser over the private socket
# Environment: PGPORT (54329), PG_DIR (.data/pg), DB_USER / DB_PASSWORD (basted / basted),
# DB_NAME (basted).
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
PGPORT="${PGPORT:-54329}"
PG_DIR="${PG_DIR:-$ROOT/.data/pg}"
DB_USER="${DB_USER:-basted}"
DB_PASSWORD="${DB_PASSWORD:-basted}"
DB_NAME="${DB_NAME:-basted}"

log() { echo "[pg] $*" >&2; }
die() { echo "[pg] error: $*" >&2; exit 1; }

find_bindir() {
  if [[ -n "${PG_BIN:-}" && -x "$PG_BIN/pg_ctl" ]]; then echo "$PG_BIN"; return 0; fi
  local d
  for d in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -rV); do   # newest major first
    if [[ -x "$d/pg_ctl" && -x "$d/initdb" && -x "$d/postgres" ]]; then echo "$d"; return 0; fi
  done
  return 1
}

cmd_install() {
  if find_bindir >/dev/null; then return 0; fi
  [[ $EUID -eq 0 ]] || die "PostgreSQL server binaries not found; install them with: sudo apt-get install -y postgresql"
  log "installing PostgreSQL from Debian (apt-get) ..."
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  # Debian's post-install makes a 'main' cluster on 5432; without systemd it is never started,
  # and Basted never uses it.
  apt-get install -y -qq --no-install-recommends postgresql >/dev/null
  find_bindir >/dev/null || die "postgresql installed, but no pg_ctl/initdb under /usr/lib/postgresql/*/bin"
}

# The server refuses to run as root, so as root every server command runs as 'postgres'.
RUN_AS=()
setup_user() {
  if [[ $EUID -eq 0 ]]; then
    id -u postgres >/dev/null 2>&1 \
      || useradd --system --user-group --home-dir /var/lib/postgresql --shell /bin/bash postgres
    RUN_AS=(runuser -u postgres --)
  fi
}
# cd /: the postgres user may not be able to read our cwd.
# 9>&-: the lock's descriptor must not leak into the daemonised postmaster, or it holds the lock forever.
as_owner() { (cd / && "${RUN_AS[@]}" "$@" 9>&-); }

pick_dir() {
  mkdir -p "$PG_DIR"
  if [[ $EUID -eq 0 ]]; then
    chown postgres:postgres "$PG_DIR"
    if ! runuser -u postgres -- test -w "$PG_DIR" 2>/dev/null; then
      # A checkout under a mode-700 parent (e.g. /root) is out of the postgres user's reach.
      local alt="/tmp/$(basename "$ROOT")-pg-$PGPORT"
      log "the postgres user cannot reach $PG_DIR; using $alt"
      rmdir "$PG_DIR" 2>/dev/null || true
      PG_DIR="$alt"; mkdir -p "$PG_DIR"; chown postgres:postgres "$PG_DIR"
    fi
  fi
  DATA="$PG_DIR/data"; SOCK="$PG_DIR/sock"; LOGFILE="$PG_DIR/server.log"
  mkdir -p "$SOCK"; touch "$LOGFILE"
  [[ $EUID -ne 0 ]] || chown postgres:postgres "$SOCK" "$LOGFILE"
}

init_cluster() {
  if [[ -f "$DATA/PG_VERSION" ]]; then
    local have want
    have="$(cat "$DATA/PG_VERSION")"
    want="$("$BIN/postgres" -V | sed -E 's/^[^0-9]*([0-9]+).*/\1/')"
    [[ "$have" == "$want" ]] || die "$DATA was made by PostgreSQL $have but $BIN is $want; delete $PG_DIR to start afresh"
    return 0
  fi
  rm -rf "$DATA"   # the remains of an interrupted initdb
  mkdir -p "$DATA"; chmod 700 "$DATA"
  [[ $EUID -ne 0 ]] || chown postgres:postgres "$DATA"
  log "initdb $DATA"
  # trust on the private socket (mode 0700: only its owner reaches it); passwords over TCP.
  as_owner "$BIN/initdb" -D "$DATA" -U postgres -E UTF8 --locale=C.UTF-8 \
    --auth-local=trust --auth-host=scram-sha-256 >"$PG_DIR/initdb.log" 2>&1 \
    || { cat "$PG_DIR/initdb.log" >&2; die "initdb failed"; }
  cat >>"$DATA/postgresql.conf" <<CONF

# --- Basted (scripts/pg.sh) ---
listen_addresses = '127.0.0.1'
port = $PGPORT
unix_socket_directories = '$SOCK'
unix_socket_permissions = 0700
max_connections = 200
timezone = 'UTC'
# Development and tests only: fast, not crash-safe. Never use these settings in production.
fsync = off
synchronous_commit = off
full_page_writes = off
CONF
}

is_up() { "$BIN/pg_isready" -q -h 127.0.0.1 -p "$PGPORT" -t 2; }

# Is the PID in postmaster.pid a live postmaster of this data folder? A dead PID, or one reused
# by another program after a reboot, makes pg_ctl refuse to start.
postmaster_alive() {
  local pidfile="$DATA/postmaster.pid" pid
  [[ -f "$pidfile" ]] || return 1
  pid="$(head -n1 "$pidfile" | tr -dc 0-9)"
  [[ -n "$pid" ]] && [[ "$(cat /proc/$pid/comm 2>/dev/null)" == postgres* ]] \
    && [[ "$(readlink -f /proc/$pid/cwd 2>/dev/null)" == "$(readlink -f "$DATA")" ]]
}

clear_stale_files() {
  if [[ -f "$DATA/postmaster.pid" ]]; then
    log "removing stale $DATA/postmaster.pid (no live postmaster of this cluster)"
    rm -f "$DATA/postmaster.pid"
  fi
  rm -f "$SOCK/.s.PGSQL.$PGPORT" "$SOCK/.s.PGSQL.$PGPORT.lock"
}

psql_super() { as_owner "$BIN/psql" -X -h "$SOCK" -p "$PGPORT" -U postgres -d postgres -v ON_ERROR_STOP=1 -qAt "$@"; }

ensure_app_role() {
  psql_super <<SQL >/dev/null
SELECT 'CREATE ROLE "$DB_USER" LOGIN CREATEDB' WHERE NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$DB_USER')\gexec
ALTER ROLE "$DB_USER" PASSWORD '$DB_PASSWORD';
-- Dropping a scratch database WITH (FORCE) may have to stop an autovacuum worker busy in it,
-- which runs as the bootstrap superuser: the app role needs this built-in role for that.
SELECT 'GRANT pg_signal_backend TO "$DB_USER"' WHERE NOT pg_has_role('$DB_USER', 'pg_signal_backend', 'MEMBER')\gexec
SELECT 'CREATE DATABASE "$DB_NAME" OWNER "$DB_USER"' WHERE NOT EXISTS (SELECT FROM pg_database WHERE datname = '$DB_NAME')\gexec
SQL
}

lock() { exec 9>"$PG_DIR/.pg.lock"; flock -w 120 9 || die "another scripts/pg.sh is busy"; }

cmd_start() {
  cmd_install
  BIN="$(find_bindir)"; setup_user; pick_dir; lock; init_cluster
  if postmaster_alive; then
    for _ in $(seq 1 60); do is_up && break; sleep 1; done
    is_up || die "the postmaster runs but accepts no connections; see $LOGFILE"
    log "already running on 127.0.0.1:$PGPORT"
  else
    clear_stale_files
    if (exec 3<>/dev/tcp/127.0.0.1/"$PGPORT") 2>/dev/null; then
      die "port $PGPORT is taken by another program; set PGPORT"
    fi
    log "starting on 127.0.0.1:$PGPORT ($DATA)"
    as_owner "$BIN/pg_ctl" -D "$DATA" -l "$LOGFILE" -w -t 60 start >/dev/null \
      || { tail -n 20 "$LOGFILE" >&2; die "pg_ctl start failed"; }
  fi
  ensure_app_role
}

cmd_stop() {
  BIN="$(find_bindir)" || { log "PostgreSQL is not installed; nothing to stop"; return 0; }
  setup_user; pick_dir; lock
  if postmaster_alive; then
    as_owner "$BIN/pg_ctl" -D "$DATA" -m fast -w -t 60 stop >/dev/null
    log "stopped"
  else
    [[ ! -f "$DATA/PG_VERSION" ]] || clear_stale_files
    log "not running"
  fi
}

cmd_status() {
  BIN="$(find_bindir)" || { echo "not installed"; return 3; }
  setup_user; pick_dir
  if postmaster_alive && is_up; then echo "running on 127.0.0.1:$PGPORT ($DATA)"; else echo "not running"; return 3; fi
}

case "${1:-}" in
  install) cmd_install ;;
  start) cmd_start ;;
  stop) cmd_stop ;;
  status) cmd_status ;;
  psql) shift; BIN="$(find_bindir)"; setup_user; pick_dir; as_owner "$BIN/psql" -X -h "$SOCK" -p "$PGPORT" -U postgres "$@" ;;
  *) echo "usage: $0 install|start|stop|status|psql" >&2; exit 2 ;;
esac
