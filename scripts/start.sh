#!/usr/bin/env bash
# npm start: install what is missing, start every service on loopback, migrate,
# load the demo scenario, serve the app. Ctrl-C stops everything it started.
set -euo pipefail
export BANDKEEP_PROFILE="${BANDKEEP_PROFILE:-dev}"
source "$(dirname "$0")/env.sh"
source "$ROOT/scripts/services.sh"
cd "$ROOT"

ensure_node_modules
trap 'log "stopping"; stop_all; exit 0' INT TERM
start_services
log "migrating"
node --import tsx scripts/migrate.ts up
node --import tsx scripts/seed.ts
build_app
start_app_and_worker

cat <<MSG

  Bandkeep is running at http://127.0.0.1:$PORT

  Demo accounts (password for all: bandkeep-demo)
    lead@aurora-lab.test        group lead, Aurora Nanocrystal Lab
    spectro@aurora-lab.test     spectroscopist
    steward@aurora-lab.test     data steward
    guest@partner-uni.test      collaborator (read-only, shared series only)
    spectro@borealis-lab.test   spectroscopist in another group (sees none of Aurora's data)

  Captured mail: sign in as the lead and open Settings → Outbox.
  Logs: ${LOG_DIR#$ROOT/}/   Stop: Ctrl-C (or npm run stop from another shell)

MSG
# Stay in the foreground while the app runs, so Ctrl-C stops what we started.
while kill -0 "$(cat "$RUN_DIR/app.pid")" 2>/dev/null; do sleep 2; done
log "the app stopped, see ${LOG_DIR#$ROOT/}/app.log"
stop_all
