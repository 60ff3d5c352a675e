#!/usr/bin/env bash
# `npm start`: install what is missing, start MariaDB, migrate, seed the demo
# data, build and serve Framefork on http://127.0.0.1:$PORT (default 3000).
# Ctrl-C stops the app; `npm run stop` stops MariaDB.
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

[ -f .env ] || cp .env.example .env
set -a
# shellcheck disable=SC1091
. ./.env
set +a
PORT="${PORT:-3000}"

bash scripts/ensure-deps.sh
bash scripts/db.sh start
npm run --silent db:migrate
npm run --silent db:seed
echo "[app] building"
node node_modules/next/dist/bin/next build >.data/build.log 2>&1 || { cat .data/build.log; exit 1; }

echo
echo "  Framefork is serving on http://127.0.0.1:$PORT"
echo "  (Ctrl-C stops the app; \`npm run stop\` stops MariaDB)"
echo
exec node node_modules/next/dist/bin/next start -p "$PORT" -H 127.0.0.1
