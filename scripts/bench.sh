#!/usr/bin/env bash
# npm run bench: the same set-up as npm start (MariaDB, the demo database `slotwise` migrated
# and seeded, a production build), then every `bench:*` script of package.json in turn
# (bench/all.ts), each rewriting its own section of docs/benchmarks.md. Benchmarks print
# figures; they are never tests, and a slow figure does not fail this command (a crash does).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

export DB_NAME="${DB_NAME:-slotwise}"
export LOG_LEVEL="${LOG_LEVEL:-silent}"

ensure_node_modules
ensure_mariadb_package
start_db
ensure_auth_secret
migrate_and_seed "$DB_NAME"

step "Building the app"
npx vite build >/tmp/slotwise-build.log 2>&1 || { tail -40 /tmp/slotwise-build.log; fail "vite build"; }

step "Running every bench:* script"
exec npx tsx bench/all.ts
