#!/usr/bin/env bash
# npm run stop: stop what npm start (or a test run left behind) started.
set -uo pipefail
for profile in ${BANDKEEP_PROFILE:-dev test}; do
  (
    export BANDKEEP_PROFILE="$profile"
    source "$(dirname "$0")/env.sh"
    source "$ROOT/scripts/services.sh"
    stop_all
    log "stopped ($profile)"
  )
done
