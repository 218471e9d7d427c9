#!/usr/bin/env bash
# Local stand-ins for hosted services, on 127.0.0.1. Sourced after lib.sh.
# Each is replaced by the real service through environment variables alone (README).

start_local_services() {
  if [ -z "${UPLOADTHING_TOKEN:-}" ] && [ -f "$ROOT/scripts/services/upload-fake.ts" ]; then
    export UPLOAD_FAKE_PORT="${UPLOAD_FAKE_PORT:-3055}"
    export UPLOAD_FAKE_URL="http://127.0.0.1:$UPLOAD_FAKE_PORT"
    # The shared secret of the fake and the app, made once per installation (never in the source).
    export UPLOAD_FAKE_KEY_FILE="${UPLOAD_FAKE_KEY_FILE:-$DATA_DIR/upload-fake.key}"
    # Run tsx directly (not through npx) so stopping it stops the server it runs.
    start_service upload-fake "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/services/upload-fake.ts"
    wait_for_url "$UPLOAD_FAKE_URL/health" upload-fake
  fi
  # Mail: a local SMTP server that keeps every mail and shows it at $MAIL_FAKE_URL, unless
  # SMTP_URL names a real one.
  if [ -z "${SMTP_URL:-}" ]; then
    export MAIL_FAKE_SMTP_PORT="${MAIL_FAKE_SMTP_PORT:-1025}"
    export MAIL_FAKE_WEB_PORT="${MAIL_FAKE_WEB_PORT:-1080}"
    export MAIL_FAKE_URL="http://127.0.0.1:$MAIL_FAKE_WEB_PORT"
    start_service mail-fake "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/services/mail-fake.ts"
    wait_for_url "$MAIL_FAKE_URL/api/health" "mail-fake"
    export SMTP_URL="smtp://127.0.0.1:$MAIL_FAKE_SMTP_PORT"
    log "mail stand-in: SMTP $SMTP_URL, read the mails at $MAIL_FAKE_URL"
  fi
}
