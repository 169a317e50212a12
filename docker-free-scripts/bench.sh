#!/usr/bin/env bash
# npm run bench: engine figures, then API figures against a running local stack.
. "$(dirname "$0")/lib.sh"
ensure_node_modules
cd "$ROOT"
npm run -s bench:engine
if [ -f test/bench/api-bench.ts ]; then
  ensure_secrets; start_postgres; start_mail_catcher; start_payment_fake
  build_if_changed api build:api apps/api libs docker-free-scripts
  npx tsx test/bench/api-bench.ts
fi
