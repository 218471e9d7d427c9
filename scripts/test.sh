#!/usr/bin/env bash
# `npm test`: set up what the tests need, then type check, lint, and run unit, integration
# (real PostgreSQL) and end-to-end (Debian's Chromium) tests. Ends with the runner's summary.
# Arguments go to vitest: `npm test -- tests/e2e/review.test.ts` runs the set-up, then only that file.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/ffmpeg.sh"

export TEST_PORT="${TEST_PORT:-3100}"
export E2E_BASE_URL="http://127.0.0.1:$TEST_PORT"
export CHROMIUM_PATH="${CHROMIUM_PATH:-/usr/bin/chromium}"
# The tests' webhook receivers listen on 127.0.0.1 (README: webhooks).
export WEBHOOK_ALLOW_PRIVATE=1

stop_all_on_exit

step() { printf '\n\033[1;35m==> %s\033[0m\n' "$*"; }

ensure_node_modules
ensure_ffmpeg
if [ ! -x "$CHROMIUM_PATH" ]; then apt_install chromium; fi
[ -x "$CHROMIUM_PATH" ] || die "Chromium not found at $CHROMIUM_PATH"

step "Type check"
(cd "$ROOT" && npx --no-install next typegen >/dev/null && npx --no-install tsc --noEmit)

step "Lint"
(cd "$ROOT" && npx --no-install eslint --max-warnings 0 .)

step "Database and local services"
PG_DATABASE=beadline_test ensure_postgres
# A test database of its own, rebuilt on every run.
TEST_DB="beadline_test"
export DATABASE_URL="${DATABASE_URL%/*}/$TEST_DB"
export DATABASE_OWNER_URL="${DATABASE_OWNER_URL%/*}/$TEST_DB"
recreate_database "$TEST_DB"
# Speed over durability, on the test database only (never the one npm start serves).
(cd "$ROOT" && node scripts/db-admin.mjs relax-durability "$TEST_DB") || die "could not configure $TEST_DB"
migrate
export UPLOAD_FAKE_PORT="${TEST_UPLOAD_FAKE_PORT:-3155}"
export MAIL_FAKE_SMTP_PORT="${TEST_MAIL_FAKE_SMTP_PORT:-1125}"
export MAIL_FAKE_WEB_PORT="${TEST_MAIL_FAKE_WEB_PORT:-1180}"
source "$ROOT/scripts/services.sh"
start_local_services
# The demo organization, its drop photos rendered and analysed by lib/analysis (about a minute).
(cd "$ROOT" && npx --no-install tsx --conditions=react-server db/seed.ts)

step "Production build"
cd "$ROOT"
if build_is_stale; then
  NODE_ENV=production npx --no-install next build >"$DATA_DIR/build.log" 2>&1 ||
    { tail -60 "$DATA_DIR/build.log"; die "next build failed; full log in .data/build.log"; }
fi
export APP_URL="$E2E_BASE_URL"
NODE_ENV=production PORT="$TEST_PORT" "$ROOT/node_modules/.bin/tsx" scripts/serve.ts \
  >"$DATA_DIR/test-server.log" 2>&1 &
BEADLINE_PIDS+=("$!")
wait_for_url "$E2E_BASE_URL/api/health" "test-server"

step "Unit, integration and end-to-end tests"
status=0
npx --no-install vitest run --reporter=default --reporter=json \
  --outputFile.json="$DATA_DIR/vitest-results.json" "$@" || status=$?
node "$ROOT/scripts/test-summary.mjs" "$DATA_DIR/vitest-results.json" || status=1
exit "$status"
