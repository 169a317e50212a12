#!/usr/bin/env bash
# npm run stop: stop everything npm start (or npm test) started.
. "$(dirname "$0")/lib.sh"
for name in api worker api-test mail-catcher payment-fake; do stop_background "$name"; done
stop_postgres
