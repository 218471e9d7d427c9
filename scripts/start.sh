#!/usr/bin/env bash
# `npm start`: set everything up and serve Beadline. `npm run dev` (--dev) serves the dev server.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/ffmpeg.sh"

MODE="production"
[ "${1:-}" = "--dev" ] && MODE="development"
export PORT="${PORT:-3000}"
export APP_URL="${APP_URL:-http://127.0.0.1:$PORT}"

stop_all_on_exit

ensure_node_modules
ensure_ffmpeg
ensure_postgres
source "$ROOT/scripts/services.sh"
start_local_services
migrate
(cd "$ROOT" && npx --no-install tsx --conditions=react-server db/seed.ts) || die "seeding the demo failed"

cd "$ROOT"
if [ "$MODE" = "production" ]; then
  if build_is_stale; then
    log "building (next build); this takes a minute or two the first time"
    NODE_ENV=production npx --no-install next build >"$DATA_DIR/build.log" 2>&1 ||
      { tail -40 "$DATA_DIR/build.log"; die "next build failed; full log in .data/build.log"; }
  fi
  NODE_ENV=production "$ROOT/node_modules/.bin/tsx" scripts/serve.ts &
else
  # The dev server lets webhooks go to a receiver on this machine (README: webhooks).
  WEBHOOK_ALLOW_PRIVATE="${WEBHOOK_ALLOW_PRIVATE:-1}" "$ROOT/node_modules/.bin/tsx" scripts/serve.ts --dev &
fi
BEADLINE_PIDS+=("$!")
wait_for_url "$APP_URL/api/health" "web"
npx --no-install tsx scripts/print-welcome.ts
wait "${BEADLINE_PIDS[-1]}"
