#!/usr/bin/env bash
# `npm test`: install what is missing, start a throwaway MariaDB (its own
# datadir and port, never the demo one), migrate, seed, then check the formatting, typecheck, lint,
# vitest, a production build and Playwright. Stops what it started, even when
# a step fails, and ends with one line "N passed, N failed". A throwaway
# maildev catches the mail the app sends.
set -uo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

bash scripts/ensure-deps.sh || exit 1
bash scripts/chromium.sh || exit 1

export DB_DIR=.data/test-mariadb
export DB_PORT="${TEST_DB_PORT:-3317}"
export DB_NAME=framefork_test
export DB_USER=framefork_test
export DB_PASSWORD=framefork-test-only
DATABASE_URL="$(bash scripts/db.sh url)"
export DATABASE_URL
export TEST_APP_PORT="${TEST_APP_PORT:-3100}"

# Its own fake mail service; browser tests read the mail through its HTTP API.
export MAIL_DIR=.data/test-maildev
export MAIL_SMTP_PORT="${TEST_SMTP_PORT:-1126}"
export MAIL_WEB_PORT="${TEST_MAIL_WEB_PORT:-1181}"
export SMTP_URL="smtp://127.0.0.1:$MAIL_SMTP_PORT"
export MAIL_FROM="Framefork <no-reply@example.com>"
export NEXTAUTH_URL="http://127.0.0.1:$TEST_APP_PORT"
export NEXTAUTH_SECRET=framefork-test-only-secret-not-for-real-use

reports=.data/reports
rm -rf "$reports" && mkdir -p "$reports"

cleanup() {
  bash scripts/mail.sh stop || true
  bash scripts/db.sh stop || true
}
trap cleanup EXIT
trap 'exit 130' INT TERM

# Stops what the run started, then prints the count as the run's very last line.
finish() {
  trap - EXIT
  cleanup
  node scripts/test-summary.mjs "$reports" "$@"
}

failed_steps=()
step() {
  local name="$1"
  shift
  echo
  echo "━━ $name"
  local started=$SECONDS
  if "$@"; then
    echo "━━ $name: ok ($((SECONDS - started)) s)"
  else
    echo "━━ $name: FAILED ($((SECONDS - started)) s)"
    failed_steps+=("$name")
    return 1
  fi
}

step "database" bash -c 'bash scripts/db.sh start && bash scripts/db.sh reset && npm run --silent db:migrate && npm run --silent db:seed' || {
  finish "database"
  exit 1
}
step "mail" bash scripts/mail.sh start || {
  finish "mail"
  exit 1
}
step "format" npx prettier --check --log-level=warn .
step "typecheck" npm run --silent typecheck
step "lint" npx eslint --max-warnings=0 .
step "vitest" npx vitest run --reporter=default --reporter=json --outputFile="$reports/vitest.json"
if step "build" node node_modules/next/dist/bin/next build; then
  step "playwright" env PLAYWRIGHT_JSON_OUTPUT_FILE="$reports/playwright.json" npx playwright test --reporter=list,json
else
  echo "[test] build failed: browser tests not run"
fi

finish "${failed_steps[@]}"
