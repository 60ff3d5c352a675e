#!/usr/bin/env bash
# `npm start`: install what is missing, start MariaDB and the fake mail
# service (maildev), migrate, seed the demo data, build and serve Framefork on
# http://127.0.0.1:$PORT (default 3000). Ctrl-C stops the app and the mail
# service if this script started it; `npm run stop` stops MariaDB and mail.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

[ -f .env ] || cp .env.example .env
set -a
# shellcheck disable=SC1091
. ./.env
set +a
PORT="${PORT:-3000}"

# A local signing secret, written once into .env so sessions survive restarts.
if [ -z "${NEXTAUTH_SECRET:-}" ]; then
  NEXTAUTH_SECRET="$(node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))')"
  if grep -q '^NEXTAUTH_SECRET=' .env; then
    sed -i "s|^NEXTAUTH_SECRET=.*|NEXTAUTH_SECRET=$NEXTAUTH_SECRET|" .env
  else
    printf '\nNEXTAUTH_SECRET=%s\n' "$NEXTAUTH_SECRET" >>.env
  fi
  echo "[auth] wrote a local NEXTAUTH_SECRET into .env"
fi
# Settings an older .env may lack.
export MAIL_SMTP_PORT="${MAIL_SMTP_PORT:-1025}"
export MAIL_WEB_PORT="${MAIL_WEB_PORT:-1080}"
export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:$MAIL_SMTP_PORT}"
export MAIL_FROM="${MAIL_FROM:-Framefork <no-reply@example.com>}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://127.0.0.1:$PORT}"
export NEXTAUTH_SECRET

bash scripts/ensure-deps.sh
bash scripts/db.sh start
# Stop the mail service with the app, unless it was already running before.
if ! bash scripts/mail.sh status 2>/dev/null; then
  bash scripts/mail.sh start
  trap 'bash scripts/mail.sh stop' EXIT
fi
npm run --silent db:migrate
npm run --silent db:seed
echo "[app] building"
node node_modules/next/dist/bin/next build >.data/build.log 2>&1 || { cat .data/build.log; exit 1; }

echo
echo "  Framefork is serving on http://127.0.0.1:$PORT"
echo "  Mail it sends lands in the inbox at http://127.0.0.1:$MAIL_WEB_PORT"
echo "  (Ctrl-C stops the app; \`npm run stop\` stops MariaDB and the mail service)"
echo
# Not exec: the EXIT trap above stops the mail service when the app stops.
bash scripts/serve.sh -p "$PORT" -H 127.0.0.1
