#!/usr/bin/env bash
# The one place that manages Framefork's local fake mail service (maildev):
# an SMTP server that keeps every message and a web inbox to read them.
#
#   scripts/mail.sh start   start maildev on 127.0.0.1 (idempotent)
#   scripts/mail.sh stop    stop it and wait for it to exit
#   scripts/mail.sh status  say whether it is running (exit 3 when not)
#
# Settings (environment, defaults in brackets): MAIL_SMTP_PORT [1025],
# MAIL_WEB_PORT [1080], MAIL_DIR [.data/maildev]. Both sides bind to
# 127.0.0.1 only; pid and log live in MAIL_DIR. No systemd, no docker.
set -euo pipefail

root="$(cd "$(dirname "$0")/.." && pwd)"
MAIL_DIR="${MAIL_DIR:-.data/maildev}"
case "$MAIL_DIR" in /*) ;; *) MAIL_DIR="$root/$MAIL_DIR" ;; esac
MAIL_SMTP_PORT="${MAIL_SMTP_PORT:-1025}"
MAIL_WEB_PORT="${MAIL_WEB_PORT:-1080}"

pidfile="$MAIL_DIR/maildev.pid"
logfile="$MAIL_DIR/maildev.log"
inbox="http://127.0.0.1:$MAIL_WEB_PORT"

say() { printf '[mail] %s\n' "$*" >&2; }

answers() { node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' "$inbox/api/healthz"; }

running() { [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null && answers; }

start() {
  mkdir -p "$MAIL_DIR"
  if running; then
    say "already running: SMTP 127.0.0.1:$MAIL_SMTP_PORT, inbox $inbox"
    return
  fi
  if [ ! -f "$root/node_modules/maildev/dist/bin/maildev.js" ]; then
    say "maildev is not installed: run npm ci first"
    exit 1
  fi
  say "starting maildev: SMTP 127.0.0.1:$MAIL_SMTP_PORT, inbox $inbox"
  # setsid: the service outlives this script and is not killed with its shell.
  setsid node "$root/node_modules/maildev/dist/bin/maildev.js" \
    --smtp "$MAIL_SMTP_PORT" --ip 127.0.0.1 --web "$MAIL_WEB_PORT" --web-ip 127.0.0.1 \
    </dev/null >"$logfile" 2>&1 &
  echo $! >"$pidfile"
  for _ in $(seq 1 100); do
    if running; then break; fi
    kill -0 "$(cat "$pidfile")" 2>/dev/null || break
    sleep 0.2
  done
  if ! running; then
    say "maildev did not answer; its log ($logfile) ends:"
    tail -n 20 "$logfile" >&2 || true
    rm -f "$pidfile"
    exit 1
  fi
  say "ready: inbox $inbox"
}

stop() {
  if ! [ -f "$pidfile" ]; then
    say "not running (no pid file in $MAIL_DIR)"
    return
  fi
  local pid
  pid="$(cat "$pidfile")"
  if kill -0 "$pid" 2>/dev/null; then
    say "stopping maildev (pid $pid)"
    kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do
      kill -0 "$pid" 2>/dev/null || break
      sleep 0.2
    done
    if kill -0 "$pid" 2>/dev/null; then
      say "maildev did not stop in 10 s; killing it"
      kill -9 "$pid" 2>/dev/null || true
    fi
  fi
  rm -f "$pidfile"
  say "stopped"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then say "running: SMTP 127.0.0.1:$MAIL_SMTP_PORT, inbox $inbox"; else say "not running"; exit 3; fi ;;
  *) echo "usage: scripts/mail.sh start|stop|status" >&2; exit 2 ;;
esac
