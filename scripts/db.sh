#!/usr/bin/env bash
# The one place that manages Framefork's private MariaDB server.
#
#   scripts/db.sh start   install MariaDB if missing, initialise the datadir,
#                         start mariadbd on loopback, create database and user
#   scripts/db.sh stop    shut the server down and wait for it to exit
#   scripts/db.sh status  say whether it is running
#   scripts/db.sh reset   drop and recreate the database (tests start empty)
#   scripts/db.sh url     print the DATABASE_URL for these settings
#
# Settings (environment, defaults in brackets): DB_DIR [.data/mariadb],
# DB_PORT [3307], DB_NAME [framefork], DB_USER [framefork],
# DB_PASSWORD [framefork-local]. No systemd, no docker: a plain mariadbd
# process with its own datadir, socket and pid file under DB_DIR.
set -euo pipefail

root="$(cd "$(dirname "$0")/.." && pwd)"
DB_DIR="${DB_DIR:-.data/mariadb}"
case "$DB_DIR" in /*) ;; *) DB_DIR="$root/$DB_DIR" ;; esac
DB_PORT="${DB_PORT:-3307}"
DB_NAME="${DB_NAME:-framefork}"
DB_USER="${DB_USER:-framefork}"
DB_PASSWORD="${DB_PASSWORD:-framefork-local}"

datadir="$DB_DIR/data"
socket="$DB_DIR/mariadb.sock"
pidfile="$DB_DIR/mariadb.pid"
logfile="$DB_DIR/mariadb.err"

say() { printf '[db] %s\n' "$*" >&2; }

ensure_installed() {
  if command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]; then return; fi
  say "mariadbd not found: installing Debian's mariadb-server"
  if [ "$(id -u)" -ne 0 ]; then
    say "installing needs root: run as root, or install mariadb-server yourself"
    exit 1
  fi
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends mariadb-server >/dev/null
  # Debian's package may start a system server; ours is private, so stop theirs.
  if command -v service >/dev/null 2>&1; then service mariadb stop >/dev/null 2>&1 || true; fi
}

bin() {
  if command -v "$1" >/dev/null 2>&1; then command -v "$1"; else echo "/usr/sbin/$1"; fi
}

client() { "$(bin mariadb)" --no-defaults --socket="$socket" -uroot "$@"; }

running() {
  [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null &&
    "$(bin mariadb-admin)" --no-defaults --socket="$socket" -uroot ping >/dev/null 2>&1
}

sql_quote() { printf "%s" "$1" | sed "s/'/''/g"; }

start() {
  ensure_installed
  mkdir -p "$DB_DIR"
  if running; then
    say "already running on 127.0.0.1:$DB_PORT (datadir $datadir)"
  else
    if [ ! -d "$datadir/mysql" ]; then
      say "initialising $datadir"
      mkdir -p "$datadir"
      "$(bin mariadb-install-db)" --no-defaults --user="$(id -un)" --datadir="$datadir" \
        --auth-root-authentication-method=socket --skip-test-db >"$DB_DIR/install.log" 2>&1 || {
        cat "$DB_DIR/install.log" >&2
        exit 1
      }
    fi
    say "starting mariadbd on 127.0.0.1:$DB_PORT"
    # setsid: the server outlives this script and is not killed with its shell.
    setsid "$(bin mariadbd)" --no-defaults --user="$(id -un)" --datadir="$datadir" \
      --bind-address=127.0.0.1 --port="$DB_PORT" --socket="$socket" --pid-file="$pidfile" \
      --log-error="$logfile" --skip-name-resolve \
      --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
      --innodb-buffer-pool-size=128M </dev/null >/dev/null 2>&1 &
    for _ in $(seq 1 150); do
      if running; then break; fi
      sleep 0.2
    done
    if ! running; then
      say "mariadbd did not answer; its log ($logfile) ends:"
      tail -n 20 "$logfile" >&2 || true
      exit 1
    fi
  fi
  local pw
  pw="$(sql_quote "$DB_PASSWORD")"
  # With --skip-name-resolve, TCP logins match 'user'@'127.0.0.1'. The user
  # may also create databases named DB_NAME_* (tests make throwaway ones).
  client <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$pw';
GRANT ALL PRIVILEGES ON \`$DB_NAME\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`${DB_NAME//_/\\_}\\_%\`.* TO '$DB_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
  say "ready: $(url)"
}

stop() {
  if ! [ -f "$pidfile" ]; then
    say "not running (no pid file in $DB_DIR)"
    return
  fi
  local pid
  pid="$(cat "$pidfile")"
  if kill -0 "$pid" 2>/dev/null; then
    say "stopping mariadbd (pid $pid)"
    "$(bin mariadb-admin)" --no-defaults --socket="$socket" -uroot shutdown >/dev/null 2>&1 || kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 150); do
      kill -0 "$pid" 2>/dev/null || break
      sleep 0.2
    done
    if kill -0 "$pid" 2>/dev/null; then
      say "mariadbd did not stop in 30 s; killing it"
      kill -9 "$pid" 2>/dev/null || true
    fi
  fi
  rm -f "$pidfile"
  say "stopped"
}

reset() {
  running || { say "not running: start it first"; exit 1; }
  say "dropping and recreating database $DB_NAME"
  client -e "DROP DATABASE IF EXISTS \`$DB_NAME\`; CREATE DATABASE \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
}

url() { printf 'mysql://%s:%s@127.0.0.1:%s/%s\n' "$DB_USER" "$DB_PASSWORD" "$DB_PORT" "$DB_NAME"; }

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then say "running on 127.0.0.1:$DB_PORT"; else say "not running"; exit 3; fi ;;
  reset) reset ;;
  url) url ;;
  *) echo "usage: scripts/db.sh start|stop|status|reset|url" >&2; exit 2 ;;
esac
