#!/usr/bin/env bash
# npm test: the same setup as npm start, then lint and every test (jest runs all projects).
export OHMPRINT_PG_FSYNC="${OHMPRINT_PG_FSYNC:-off}" # a test cluster is throwaway: speed over durability
. "$(dirname "$0")/lib.sh"

ensure_node_modules
ensure_debian_package pdfsig poppler-utils
ensure_debian_package chromium chromium
ensure_secrets
start_postgres
start_mail_catcher
start_payment_fake
log "lint"
(cd "$ROOT" && npx eslint . --max-warnings=0)
build_if_changed api build:api apps/api libs docker-free-scripts
build_if_changed portals build:portals apps/client-portal apps/lab-portal libs angular.json
log "jest (all projects)"
cd "$ROOT" && npx jest --ci --maxWorkers=2 "$@"
