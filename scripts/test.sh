#!/usr/bin/env bash
# npm test: type-check, lint, then start fresh services on the test ports and run
# every test (unit, engine, integration, browser). Exits non-zero on any failure.
set -euo pipefail
export BANDKEEP_PROFILE=test
source "$(dirname "$0")/env.sh"
source "$ROOT/scripts/services.sh"
cd "$ROOT"

ensure_node_modules
ensure_chromium

log "type-check"
node node_modules/typescript/bin/tsc --noEmit -p .
log "lint"
node node_modules/eslint/bin/eslint.js --max-warnings=0 .
log "format check (npm run format fixes it)"
node node_modules/prettier/bin/prettier.cjs --check --log-level=warn .

stop_all
wipe_postgres
rm -rf "$BANDKEEP_DATA_DIR/redis" "$S3_LOCAL_DIR" "$LOG_DIR"/*.log
trap 'stop_all' EXIT
start_services
node --import tsx scripts/migrate.ts up
node --import tsx scripts/seed.ts
build_app
start_app_and_worker

log "running tests"
node node_modules/vitest/vitest.mjs run "$@"
