#!/usr/bin/env bash
# npm run dev: vite dev server against the same project-local database as npm start.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
export DB_NAME="${DB_NAME:-slotwise}"
ensure_node_modules
ensure_mariadb_package
start_db
start_mail_fake
start_ecb_fake
start_payment_fake
register_payment_webhook "http://127.0.0.1:${PORT:-5173}"
ensure_auth_secret
migrate_and_seed "$DB_NAME"
exec npx vite dev --host 127.0.0.1 --port "${PORT:-5173}"
