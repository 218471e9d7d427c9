#!/usr/bin/env bash
# `npm run db:backup [-- FILE]` and `npm run db:restore -- FILE [--force]`: the database and the
# upload stand-in's photos in one archive (scripts/db-backup.ts). Starts the private cluster when
# it is not running, and stops it again afterwards.
set -euo pipefail
source "$(dirname "$0")/lib.sh"

stop_all_on_exit

ensure_node_modules
ensure_postgres >&2
export UPLOAD_FAKE_DATA_DIR="${UPLOAD_FAKE_DATA_DIR:-$DATA_DIR/uploads}"
(cd "$ROOT" && "$ROOT/node_modules/.bin/tsx" scripts/db-backup.ts "$@")
