# Functions that install (when missing), start and stop the local services.
# Sourced after scripts/env.sh.

log() { printf '\033[36m[bandkeep]\033[0m %s\n' "$*"; }
die() { printf '\033[31m[bandkeep] %s\033[0m\n' "$*" >&2; exit 1; }

apt_ready=0
apt_install() {
  command -v apt-get >/dev/null || die "apt-get not found: install $* by hand"
  [ "$(id -u)" = 0 ] || die "installing $* needs root (run: sudo apt-get install -y $*)"
  if [ "$apt_ready" = 0 ]; then
    log "apt-get update"
    apt-get update -qq >/dev/null
    apt_ready=1
  fi
  log "apt-get install $*"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

pg_bin() {
  local d
  d=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)
  echo "$d"
}

ensure_system_packages() {
  [ -n "$(pg_bin)" ] || apt_install postgresql
  command -v redis-server >/dev/null || apt_install redis-server
}

ensure_chromium() {
  command -v chromium >/dev/null || apt_install chromium
}

ensure_node_modules() {
  if [ ! -d "$ROOT/node_modules/next" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "npm ci"
    (cd "$ROOT" && npm ci --no-audit --no-fund) || die "npm ci failed"
  fi
}

# Run a command as the unprivileged postgres user when we are root (initdb refuses root).
as_pg() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

# Where the cluster lives: under the data folder, unless we are root and the postgres user
# cannot reach that folder (a clone under a mode-700 home, say), where initdb would fail with
# "Permission denied"; then under the postgres user's home, one folder per data folder.
pg_cluster_dir() {
  if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$BANDKEEP_DATA_DIR" 2>/dev/null; then
    local home
    home=$(getent passwd postgres | cut -d: -f6)
    echo "${home:-/var/lib/postgresql}/bandkeep-$(printf '%s' "$BANDKEEP_DATA_DIR" | sha256sum | cut -c1-12)"
  else
    echo "$BANDKEEP_DATA_DIR"
  fi
}

url_user() { local u="${1#*://}"; u="${u%%@*}"; echo "${u%%:*}"; }
url_db() { local d="${1##*/}"; echo "${d%%\?*}"; }

# The two database roles: the owner runs migrations (and owns the database), the app role
# gets row access only (migrations/0006 grants it). A database made by an earlier version
# as the postgres superuser is handed to the owner role.
ensure_db_roles() {
  local owner app db
  owner=$(url_user "$MIGRATION_DATABASE_URL"); app=$(url_user "$DATABASE_URL"); db=$(url_db "$DATABASE_URL")
  local su=(psql -h 127.0.0.1 -p "$PGPORT_LOCAL" -U postgres -v ON_ERROR_STOP=1 -qtA)
  "${su[@]}" -d postgres >/dev/null <<SQL || die "could not create the database roles $owner and $app"
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$owner') THEN CREATE ROLE "$owner" LOGIN CREATEDB; END IF;
  IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$app') THEN CREATE ROLE "$app" LOGIN; END IF;
END \$\$;
SQL
  if ! "${su[@]}" -d postgres -c "select 1 from pg_database where datname='$db'" | grep -q 1; then
    "${su[@]}" -d postgres -c "create database \"$db\" owner \"$owner\"" >/dev/null || die "could not create database $db"
  fi
  "${su[@]}" -d "$db" >/dev/null <<SQL || die "could not hand database $db to $owner"
ALTER DATABASE "$db" OWNER TO "$owner";
DO \$\$ DECLARE r record; BEGIN
  FOR r IN SELECT c.relname, c.relkind FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
           WHERE n.nspname = 'public' AND c.relkind IN ('r','p','v','m','S') AND pg_get_userbyid(c.relowner) <> '$owner' LOOP
    IF r.relkind = 'S' THEN EXECUTE format('ALTER SEQUENCE public.%I OWNER TO %I', r.relname, '$owner');
    ELSE EXECUTE format('ALTER TABLE public.%I OWNER TO %I', r.relname, '$owner'); END IF;
  END LOOP;
  FOR r IN SELECT p.oid::regprocedure AS sig FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace
           WHERE n.nspname = 'public' AND pg_get_userbyid(p.proowner) <> '$owner' LOOP
    EXECUTE format('ALTER FUNCTION %s OWNER TO %I', r.sig, '$owner');
  END LOOP;
  FOR r IN SELECT t.typname FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
           WHERE n.nspname = 'public' AND t.typtype = 'e' AND pg_get_userbyid(t.typowner) <> '$owner' LOOP
    EXECUTE format('ALTER TYPE public.%I OWNER TO %I', r.typname, '$owner');
  END LOOP;
END \$\$;
SQL
}

start_postgres() {
  local bin data sock cluster
  bin=$(pg_bin); cluster=$(pg_cluster_dir); data="$cluster/pg"; sock="$cluster/pgsock"
  [ "$cluster" = "$BANDKEEP_DATA_DIR" ] || log "the postgres user cannot reach $BANDKEEP_DATA_DIR: keeping the cluster in $cluster"
  mkdir -p "$data" "$sock"
  if [ "$(id -u)" = 0 ]; then chown postgres:postgres "$data" "$sock"; [ "$cluster" = "$BANDKEEP_DATA_DIR" ] || chown postgres:postgres "$cluster"; fi
  chmod 700 "$data"
  if [ ! -f "$data/PG_VERSION" ]; then
    log "initdb $data"
    as_pg "$bin/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$LOG_DIR/initdb.log" 2>&1 \
      || die "initdb failed, see $LOG_DIR/initdb.log"
  fi
  if as_pg "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; then
    log "PostgreSQL already running on $PGPORT_LOCAL"
  else
    # The server writes its own log, so it lives where the postgres user can write.
    local pglog="$LOG_DIR/postgres.log"
    [ "$cluster" = "$BANDKEEP_DATA_DIR" ] || pglog="$cluster/postgres.log"
    touch "$pglog"; [ "$(id -u)" = 0 ] && chown postgres "$pglog"
    as_pg "$bin/pg_ctl" -D "$data" -l "$pglog" -w \
      -o "-k $sock -h 127.0.0.1 -p $PGPORT_LOCAL" start >/dev/null || die "PostgreSQL did not start, see $pglog"
    log "PostgreSQL on 127.0.0.1:$PGPORT_LOCAL"
  fi
  ensure_db_roles
}

# Removes the cluster's files (npm test starts from a fresh one).
wipe_postgres() {
  local cluster
  cluster=$(pg_cluster_dir)
  rm -rf "$cluster/pg" "$cluster/pgsock"
}

stop_postgres() {
  local bin data
  bin=$(pg_bin); data="$(pg_cluster_dir)/pg"
  [ -f "$data/PG_VERSION" ] || return 0
  as_pg "$bin/pg_ctl" -D "$data" -m fast stop >/dev/null 2>&1 || true
}

start_redis() {
  local dir="$BANDKEEP_DATA_DIR/redis"
  mkdir -p "$dir"
  if redis-cli -p "$REDIS_PORT_LOCAL" ping >/dev/null 2>&1; then
    log "Redis already running on $REDIS_PORT_LOCAL"; return 0
  fi
  redis-server --bind 127.0.0.1 --port "$REDIS_PORT_LOCAL" --dir "$dir" --appendonly yes \
    --daemonize yes --pidfile "$RUN_DIR/redis.pid" --logfile "$LOG_DIR/redis.log" --save "" >/dev/null \
    || die "Redis did not start, see $LOG_DIR/redis.log"
  for _ in $(seq 1 50); do redis-cli -p "$REDIS_PORT_LOCAL" ping >/dev/null 2>&1 && break; sleep 0.1; done
  log "Redis on 127.0.0.1:$REDIS_PORT_LOCAL (append-only)"
}

stop_redis() {
  redis-cli -p "$REDIS_PORT_LOCAL" shutdown >/dev/null 2>&1 || true
}

# Start a long-running node process in its own process group, remembering its pid.
start_bg() {
  local name="$1"; shift
  if [ -f "$RUN_DIR/$name.pid" ] && kill -0 "$(cat "$RUN_DIR/$name.pid")" 2>/dev/null; then
    log "$name already running"; return 0
  fi
  setsid "$@" >>"$LOG_DIR/$name.log" 2>&1 < /dev/null &
  echo $! > "$RUN_DIR/$name.pid"
}

stop_bg() {
  local name="$1" pid
  [ -f "$RUN_DIR/$name.pid" ] || return 0
  pid=$(cat "$RUN_DIR/$name.pid")
  if kill -0 "$pid" 2>/dev/null; then
    kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -KILL -- "-$pid" 2>/dev/null || true
  fi
  rm -f "$RUN_DIR/$name.pid"
}

wait_http() {
  local url="$1" name="$2" tries="${3:-150}"
  for _ in $(seq 1 "$tries"); do
    curl -s -o /dev/null "$url" && return 0
    sleep 0.2
  done
  die "$name did not answer at $url, see $LOG_DIR/$name.log"
}

start_fakes() {
  mkdir -p "$S3_LOCAL_DIR"
  start_bg storage node --import tsx "$ROOT/scripts/services/storage-fake.ts"
  start_bg mail node --import tsx "$ROOT/scripts/services/mail-fake.ts"
  wait_http "$S3_ENDPOINT" storage
  wait_http "$MAIL_VIEW_URL/messages" mail
  log "storage fake on $S3_ENDPOINT (objects under ${S3_LOCAL_DIR#$ROOT/})"
  log "mail fake: SMTP on $SMTP_PORT_LOCAL, captured mail at $MAIL_VIEW_URL"
}

start_services() {
  ensure_system_packages
  start_postgres
  start_redis
  start_fakes
}

stop_all() {
  stop_bg app
  stop_bg worker
  stop_bg mail
  stop_bg storage
  stop_redis
  stop_postgres
}

needs_build() {
  local dist="$ROOT/${NEXT_DIST_DIR:-.next}"
  [ -f "$dist/BUILD_ID" ] || return 0
  [ -n "$(find "$ROOT/app" "$ROOT/components" "$ROOT/lib" "$ROOT/models" "$ROOT/next.config.mjs" "$ROOT/package-lock.json" \
    -newer "$dist/BUILD_ID" -type f 2>/dev/null | head -n 1)" ]
}

build_app() {
  if needs_build; then
    log "building the app (next build)"
    (cd "$ROOT" && node node_modules/next/dist/bin/next build >"$LOG_DIR/build.log" 2>&1) \
      || { tail -n 40 "$LOG_DIR/build.log"; die "next build failed, see $LOG_DIR/build.log"; }
  fi
}

start_app_and_worker() {
  start_bg worker node --import tsx "$ROOT/workers/index.ts"
  start_bg app node "$ROOT/scripts/serve.mjs" -H 127.0.0.1 -p "$PORT"
  wait_http "http://127.0.0.1:$PORT/api/health" app 300
}
