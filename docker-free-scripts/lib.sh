#!/usr/bin/env bash
# Shared settings and helpers for the local services. Sourced, never run directly.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA="$ROOT/.data"
RUN="$DATA/run"
LOGS="$DATA/logs"
mkdir -p "$RUN" "$LOGS"

PG_PORT="${OHMPRINT_PG_PORT:-54329}"
PG_DIR="$DATA/pg"
MAIL_SMTP_PORT="${OHMPRINT_SMTP_PORT:-1025}"
MAIL_WEB_PORT="${OHMPRINT_MAIL_WEB_PORT:-1080}"
PAYMENT_FAKE_PORT="${OHMPRINT_PAYMENT_FAKE_PORT:-12111}"
APP_PORT="${PORT:-4300}"
# fsync stays on for the cluster npm start runs (a crash or power loss must not corrupt a lab's
# data); test.sh sets OHMPRINT_PG_FSYNC=off for a throwaway test cluster's speed.
PG_FSYNC="${OHMPRINT_PG_FSYNC:-on}"
# Each clone's mail catcher keeps its messages in its own .data folder.
MAIL_DIR="$DATA/mail"

log() { printf '\033[36m[ohmprint]\033[0m %s\n' "$*"; }
die() { printf '\033[31m[ohmprint] %s\033[0m\n' "$*" >&2; exit 1; }

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

apt_updated=0
ensure_debian_package() { # ensure_debian_package <probe-command-or-path> <package...>
  local probe="$1"; shift
  if [ -e "$probe" ] || command -v "$probe" >/dev/null 2>&1; then return 0; fi
  log "installing Debian packages: $*"
  if [ "$apt_updated" = 0 ]; then as_root apt-get update -q >"$LOGS/apt.log" 2>&1; apt_updated=1; fi
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -q "$@" >>"$LOGS/apt.log" 2>&1 \
    || die "apt-get install $* failed; see $LOGS/apt.log"
}

ensure_node_modules() {
  local stamp="$ROOT/node_modules/.package-lock.json"
  if [ ! -f "$stamp" ] || [ "$ROOT/package-lock.json" -nt "$stamp" ]; then
    log "installing npm packages (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund) >"$LOGS/npm-ci.log" 2>&1 || { tail -30 "$LOGS/npm-ci.log"; die "npm ci failed"; }
  fi
}

# Development secrets live in .data/secrets.env, generated once and never committed.
ensure_secrets() {
  local f="$DATA/secrets.env"
  if [ ! -f "$f" ]; then
    log "generating development secrets in .data/secrets.env"
    # umask in a subshell: only the secrets file is private; what the scripts create afterwards
    # (and every process they start, tests included) keeps the usual permissions.
    (
      umask 077
      {
        echo "PG_SUPERUSER_PASSWORD=$(openssl rand -hex 24)"
        echo "PG_APP_PASSWORD=$(openssl rand -hex 24)"
        echo "JWT_ACCESS_SECRET=$(openssl rand -hex 32)"
        echo "PAYMENT_WEBHOOK_SECRET=whsec_$(openssl rand -hex 24)"
      } >"$f"
    )
  fi
  set -a; . "$f"; set +a
  export DATABASE_HOST=127.0.0.1 DATABASE_PORT="$PG_PORT" DATABASE_USER=ohmprint DATABASE_PASSWORD="$PG_APP_PASSWORD"
  export SMTP_HOST=127.0.0.1 SMTP_PORT="$MAIL_SMTP_PORT" MAIL_INBOX_URL="http://127.0.0.1:$MAIL_WEB_PORT"
  export STRIPE_API_BASE="http://127.0.0.1:$PAYMENT_FAKE_PORT" STRIPE_SECRET_KEY="${STRIPE_SECRET_KEY:-sk_test_ohmprint_local}"
  export OHMPRINT_DATA_DIR="$DATA"
}

pg_bin() {
  local initdb; initdb=$(ls -d /usr/lib/postgresql/*/bin/initdb 2>/dev/null | sort -V | tail -1 || true)
  [ -n "$initdb" ] && dirname "$initdb"
}

pg_as() { runuser -u postgres -- "$@"; }

psql_super() { PGPASSWORD="$PG_SUPERUSER_PASSWORD" "$(pg_bin)/psql" -h 127.0.0.1 -p "$PG_PORT" -U postgres -v ON_ERROR_STOP=1 -qAt "$@"; }

start_postgres() {
  [ -n "$(pg_bin)" ] || ensure_debian_package /nonexistent-initdb postgresql
  local bin; bin=$(pg_bin); [ -n "$bin" ] || die "PostgreSQL server binaries not found after install"
  # Debian's package starts a cluster of its own on 5432; ours is private and on another port.
  if [ ! -f "$PG_DIR/data/PG_VERSION" ]; then
    log "creating a private PostgreSQL cluster in .data/pg"
    mkdir -p "$PG_DIR"; chown postgres:postgres "$PG_DIR"; chmod 700 "$PG_DIR"
    local pw="$PG_DIR/.pw"; printf '%s\n' "$PG_SUPERUSER_PASSWORD" >"$pw"; chown postgres "$pw"
    pg_as "$bin/initdb" -D "$PG_DIR/data" -U postgres --pwfile="$pw" --auth-local=trust \
      --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >"$LOGS/initdb.log" 2>&1 || die "initdb failed; see $LOGS/initdb.log"
    rm -f "$pw"
  fi
  pg_as mkdir -p "$PG_DIR/sock"
  local opts="-p $PG_PORT -c listen_addresses=127.0.0.1 -k $PG_DIR/sock -c fsync=$PG_FSYNC -c max_connections=200"
  if ! pg_as "$bin/pg_ctl" -D "$PG_DIR/data" status >/dev/null 2>&1; then
    log "starting PostgreSQL on 127.0.0.1:$PG_PORT"
    pg_as "$bin/pg_ctl" -D "$PG_DIR/data" -l "$PG_DIR/server.log" -w -t 60 -o "$opts" start >/dev/null \
      || die "PostgreSQL did not start; see $PG_DIR/server.log"
  elif [ "$PG_FSYNC" = on ] && [ "$(psql_super -d postgres -c 'show fsync')" = off ]; then
    # npm start on a cluster npm test left running without fsync: the lab's data needs it on.
    # (npm test beside a running npm start keeps fsync on: it never turns it off under a running instance.)
    log "restarting PostgreSQL with fsync on (npm test had started it without)"
    pg_as "$bin/pg_ctl" -D "$PG_DIR/data" -l "$PG_DIR/server.log" -w -t 60 -m fast -o "$opts" restart >/dev/null \
      || die "PostgreSQL did not restart; see $PG_DIR/server.log"
  fi
  if [ "$(psql_super -d postgres -c "select 1 from pg_roles where rolname='ohmprint'")" != 1 ]; then
    psql_super -d postgres -c "create role ohmprint login createdb password '$PG_APP_PASSWORD'"
  fi
  ensure_database ohmprint
}

ensure_database() {
  if [ "$(psql_super -d postgres -c "select 1 from pg_database where datname='$1'")" != 1 ]; then
    psql_super -d postgres -c "create database $1 owner ohmprint"
  fi
}

stop_postgres() {
  local bin; bin=$(pg_bin) || true
  if [ -n "$bin" ] && [ -f "$PG_DIR/data/PG_VERSION" ] && pg_as "$bin/pg_ctl" -D "$PG_DIR/data" status >/dev/null 2>&1; then
    log "stopping PostgreSQL"; pg_as "$bin/pg_ctl" -D "$PG_DIR/data" -m fast -w stop >/dev/null
  fi
}

is_running() { [ -f "$RUN/$1.pid" ] && kill -0 "$(cat "$RUN/$1.pid")" 2>/dev/null; }

start_background() { # start_background <name> <command...>
  local name="$1"; shift
  if is_running "$name"; then return 0; fi
  (cd "$ROOT" && exec setsid "$@" >"$LOGS/$name.log" 2>&1 < /dev/null) &
  echo $! >"$RUN/$name.pid"
}

stop_background() {
  if is_running "$1"; then log "stopping $1"; kill -- "-$(cat "$RUN/$1.pid")" 2>/dev/null || kill "$(cat "$RUN/$1.pid")" 2>/dev/null || true; fi
  rm -f "$RUN/$1.pid"
}

wait_for_port() { # wait_for_port <port> <name> [seconds]
  local i; for i in $(seq 1 "${3:-60}"); do
    (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null && return 0; sleep 0.5
  done
  die "$2 did not open port $1; see $LOGS/$2.log"
}

start_mail_catcher() {
  start_background mail-catcher "$ROOT/node_modules/.bin/maildev" --ip 127.0.0.1 --smtp "$MAIL_SMTP_PORT" \
    --web-ip 127.0.0.1 --web "$MAIL_WEB_PORT" --mail-directory "$MAIL_DIR" --silent
  wait_for_port "$MAIL_SMTP_PORT" mail-catcher
}

start_payment_fake() {
  export PAYMENT_WEBHOOK_URL="${PAYMENT_WEBHOOK_URL:-http://127.0.0.1:$APP_PORT/api/payments/webhook}"
  start_background payment-fake node "$ROOT/docker-free-scripts/payment-fake.mjs" "$PAYMENT_FAKE_PORT"
  wait_for_port "$PAYMENT_FAKE_PORT" payment-fake
}

# Rebuild only when sources changed since the last build (hash of tracked and new files).
sources_hash() { (cd "$ROOT" && git ls-files -co --exclude-standard -- "$@" 2>/dev/null | sort | xargs -r sha1sum | sha1sum | cut -c1-40); }

build_if_changed() { # build_if_changed <name> <npm-script> <paths...>
  local name="$1" script="$2"; shift 2
  local h; h=$(sources_hash "$@" package-lock.json tsconfig.json)
  if [ "$(cat "$DATA/$name.build-hash" 2>/dev/null)" != "$h" ]; then
    log "building $name"
    (cd "$ROOT" && npm run -s "$script") >"$LOGS/build-$name.log" 2>&1 || { tail -40 "$LOGS/build-$name.log"; die "build of $name failed"; }
    echo "$h" >"$DATA/$name.build-hash"
  fi
}
