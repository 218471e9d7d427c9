#!/usr/bin/env bash
# Local stand-ins for hosted services, on 127.0.0.1. Sourced after lib.sh.
# Each is replaced by the real service through environment variables alone (README).

start_local_services() {
  if [ -z "${UPLOADTHING_TOKEN:-}" ] && [ -f "$ROOT/scripts/services/upload-fake.ts" ]; then
    export UPLOAD_FAKE_PORT="${UPLOAD_FAKE_PORT:-3055}"
    export UPLOAD_FAKE_URL="http://127.0.0.1:$UPLOAD_FAKE_PORT"
    # Run tsx directly (not through npx) so stopping it stops the server it runs.
    start_service upload-fake "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/services/upload-fake.ts"
    wait_for_url "$UPLOAD_FAKE_URL/health" upload-fake
  fi
}
