#!/usr/bin/env bash
# npm run bench: engine figures, then API figures against a running local stack.
. "$(dirname "$0")/lib.sh"
ensure_node_modules
cd "$ROOT"
npm run -s bench:engine
# every test/bench/api-*.ts file runs in name order against the local stack
api_benches=(test/bench/api-*.ts)
if [ -f "${api_benches[0]}" ]; then
  ensure_secrets; start_postgres; start_mail_catcher; start_payment_fake
  build_if_changed api build:api apps/api libs docker-free-scripts
  # one failing bench does not hide the figures of the others; the run still ends in failure
  failed=()
  for bench in "${api_benches[@]}"; do
    log "bench: $bench"
    npx tsx "$bench" || failed+=("$bench")
  done
  [ ${#failed[@]} -eq 0 ] || die "benches that failed: ${failed[*]}"
fi
