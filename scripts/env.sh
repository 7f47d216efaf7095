# Shared settings for the start, test and stop scripts. Every value can be
# overridden from the environment; the defaults keep everything on loopback.
# Usage: BANDKEEP_PROFILE=dev|test source scripts/env.sh
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# runuser and the PostgreSQL tools live in sbin folders that a minimal PATH may leave out.
case ":$PATH:" in *:/usr/sbin:*) ;; *) export PATH="$PATH:/usr/sbin:/sbin" ;; esac
PROFILE="${BANDKEEP_PROFILE:-dev}"
if [ "$PROFILE" = "test" ]; then off=10; else off=0; fi
off="${BANDKEEP_PORT_OFFSET:-$off}"  # a further copy (a clean clone, say) can run beside these

export BANDKEEP_DATA_DIR="${BANDKEEP_DATA_DIR:-$ROOT/.data/$PROFILE}"
export PGPORT_LOCAL="${PGPORT_LOCAL:-$((54329 + off))}"
export REDIS_PORT_LOCAL="${REDIS_PORT_LOCAL:-$((63799 + off))}"
export S3_PORT_LOCAL="${S3_PORT_LOCAL:-$((45690 + off))}"
export SMTP_PORT_LOCAL="${SMTP_PORT_LOCAL:-$((25250 + off))}"
export MAIL_VIEW_PORT_LOCAL="${MAIL_VIEW_PORT_LOCAL:-$((25350 + off))}"
export PORT="${PORT:-$((3000 + off * 10))}"

# The app and worker connect as a least-privilege role; migrations run as the owner role
# (scripts/services.sh creates both on the local server; see README, "Managed services").
export DATABASE_URL="${DATABASE_URL:-postgres://bandkeep_app@127.0.0.1:$PGPORT_LOCAL/bandkeep}"
export MIGRATION_DATABASE_URL="${MIGRATION_DATABASE_URL:-postgres://bandkeep_owner@127.0.0.1:$PGPORT_LOCAL/bandkeep}"
# The local server's superuser, for scripts that make scratch databases (seed:scale, bench:scale and
# the query-plan test); never used by the app or the worker.
export ADMIN_DATABASE_URL="${ADMIN_DATABASE_URL:-postgres://postgres@127.0.0.1:$PGPORT_LOCAL/bandkeep}"
export REDIS_URL="${REDIS_URL:-redis://127.0.0.1:$REDIS_PORT_LOCAL}"
export S3_ENDPOINT="${S3_ENDPOINT:-http://127.0.0.1:$S3_PORT_LOCAL}"
export S3_BUCKET="${S3_BUCKET:-bandkeep-$PROFILE}"
export S3_REGION="${S3_REGION:-us-east-1}"
export S3_ACCESS_KEY_ID="${S3_ACCESS_KEY_ID:-S3RVER}"
export S3_SECRET_ACCESS_KEY="${S3_SECRET_ACCESS_KEY:-S3RVER}"
export S3_LOCAL_DIR="${S3_LOCAL_DIR:-$ROOT/local-s3/$PROFILE}"
export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:$SMTP_PORT_LOCAL}"
export MAIL_FROM="${MAIL_FROM:-Bandkeep <no-reply@bandkeep.invalid>}"
export MAIL_VIEW_URL="${MAIL_VIEW_URL:-http://127.0.0.1:$MAIL_VIEW_PORT_LOCAL}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://127.0.0.1:$PORT}"
export APP_URL="${APP_URL:-$NEXTAUTH_URL}"
export NEXT_TELEMETRY_DISABLED=1
# The SDK version is pinned for Node 20 (see README); its Node 22 notice is noise here.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
export BANDKEEP_QUEUE="${BANDKEEP_QUEUE:-bandkeep-analysis}"
# Decision mail waits this long for more decisions to the same person (shorter under test).
if [ "$PROFILE" = "test" ]; then export NOTICE_WINDOW_MS="${NOTICE_WINDOW_MS:-3000}"; else export NOTICE_WINDOW_MS="${NOTICE_WINDOW_MS:-60000}"; fi

RUN_DIR="$BANDKEEP_DATA_DIR/run"
LOG_DIR="$BANDKEEP_DATA_DIR/log"
mkdir -p "$RUN_DIR" "$LOG_DIR"

# A stable per-machine secret, made once and kept with the data.
if [ -z "${NEXTAUTH_SECRET:-}" ]; then
  if [ ! -s "$BANDKEEP_DATA_DIR/secret" ]; then
    head -c 32 /dev/urandom | base64 > "$BANDKEEP_DATA_DIR/secret"
  fi
  NEXTAUTH_SECRET="$(cat "$BANDKEEP_DATA_DIR/secret")"
  export NEXTAUTH_SECRET
fi
