#!/usr/bin/env bash
# npm start: install what is missing, start the local services, build, migrate, seed, serve.
. "$(dirname "$0")/lib.sh"

ensure_node_modules
ensure_secrets
start_postgres
start_mail_catcher
start_payment_fake
build_if_changed api build:api apps/api libs docker-free-scripts
build_if_changed portals build:portals apps/client-portal apps/lab-portal libs angular.json
export DATABASE_NAME=ohmprint
log "migrating the database"
(cd "$ROOT" && npm run -s db:migrate) >"$LOGS/migrate.log" 2>&1 || { tail -30 "$LOGS/migrate.log"; die "migration failed"; }
log "seeding the demo (idempotent)"
(cd "$ROOT" && npm run -s db:seed) >"$LOGS/seed.log" 2>&1 || { tail -30 "$LOGS/seed.log"; die "seed failed"; }
stop_background api
stop_background worker
start_background api node "$ROOT/dist/api/apps/api/src/main.js"
# the worker runs queued jobs: report issuance, e-mail, large publications and analyses
start_background worker node "$ROOT/dist/api/apps/api/src/worker.js"
for i in $(seq 1 60); do
  curl -fs "http://127.0.0.1:$APP_PORT/api/health" >/dev/null 2>&1 && break
  is_running api || { tail -30 "$LOGS/api.log"; die "the API stopped during start"; }
  sleep 0.5
done
curl -fs "http://127.0.0.1:$APP_PORT/api/health" >/dev/null || { tail -30 "$LOGS/api.log"; die "the API did not answer /api/health"; }
sleep 1
is_running worker || { tail -30 "$LOGS/worker.log"; die "the worker stopped during start"; }

cat <<MSG

  Ohmprint is running (demo data: invented, for demonstration only)

  Client portal        http://127.0.0.1:$APP_PORT/
  Lab portal           http://127.0.0.1:$APP_PORT/lab/
  Report verification  http://127.0.0.1:$APP_PORT/verify
  API                  http://127.0.0.1:$APP_PORT/api/   (OpenAPI: /api/docs)
  Mail inbox           http://127.0.0.1:$MAIL_WEB_PORT/
  Worker (jobs)        running beside the API (log: .data/logs/worker.log)
  Logs                 .data/logs/        Stop everything: npm run stop

MSG
cat "$DATA/demo-accounts.txt" 2>/dev/null || true
