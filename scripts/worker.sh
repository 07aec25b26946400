#!/usr/bin/env bash
# npm run worker: the mail worker as its own process, against the same MariaDB and SMTP
# server as `npm start` in this checkout (ports from .data/), or against DB_HOST and
# SMTP_HOST when the environment names them (another machine). Any number may run at once.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

export DB_NAME="${DB_NAME:-slotwise}"
# The digest's links point at the app: npm start's address unless ORIGIN names another.
export ORIGIN="${ORIGIN:-http://127.0.0.1:${PORT:-3000}}"
if [ -z "${DB_HOST:-}" ] || [ "$DB_HOST" = "127.0.0.1" ]; then
	start_db
fi
start_mail_fake
step "Mail worker on database $DB_NAME (stop with Ctrl+C)"
# One process (tsx as a loader, not a launcher), so signals reach the worker itself.
exec node --import tsx scripts/worker.ts
