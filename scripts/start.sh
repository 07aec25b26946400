#!/usr/bin/env bash
# npm start: install what is missing, start MariaDB, migrate, seed the demo, build, serve.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export ORIGIN="${ORIGIN:-http://127.0.0.1:$PORT}"
# Room for 15 MB photo uploads (and the 1 MiB catalog CSV import); the hook holds every other
# route to 512 KB and the upload routes to the photo limit (docs/security.md §6).
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-16M}"
export DB_NAME="${DB_NAME:-slotwise}"

ensure_node_modules
ensure_mariadb_package
start_db
start_mail_fake
start_ecb_fake
start_payment_fake
register_payment_webhook "$ORIGIN"
ensure_auth_secret
migrate_and_seed "$DB_NAME"

step "Building the app"
npx vite build >/tmp/slotwise-build.log 2>&1 || { tail -40 /tmp/slotwise-build.log; fail "vite build"; }

cat <<MSG

Slotwise is running at $ORIGIN

Demo accounts (demo seed only; password for all: slotwise-demo-password)
  admin@slotwise.test    admin
  editor@slotwise.test   editor
  author@slotwise.test   author
  reader@slotwise.test   reader

Stop with Ctrl+C (MariaDB keeps running: npm run db:stop).
MSG
if [ -n "${MAILBOX_URL:-}" ]; then
	echo "E-mail goes to the local SMTP fake; read it at $ORIGIN/dev/mailbox (stop it: bash scripts/smtp-fake.sh stop)"
fi
exec node "$APP_HEAP_FLAG" build
