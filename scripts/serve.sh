#!/usr/bin/env bash
# npm run serve: one more app process (`node build`) against the database `npm start` set up,
# e.g. `PORT=3001 npm run serve` beside `npm start` on 3000. It migrates, seeds and builds
# nothing: it reuses this checkout's build/, the ports in .data/*.port (MariaDB, the mail
# and rates fakes) and the Auth.js secret in .data/auth-secret, so sessions, rate limits
# and data are shared with every other process. Variables set in the environment win, as
# a deployment sets them all itself (docs/deployment.md).
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

export PORT="${PORT:-3001}"
export HOST="${HOST:-127.0.0.1}"
export ORIGIN="${ORIGIN:-http://127.0.0.1:$PORT}"
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-16M}"
export DB_NAME="${DB_NAME:-slotwise}"

# from_file VAR FILE: VAR from .data/FILE unless already set.
from_file() {
	if [ -z "${!1:-}" ] && [ -s "$DATA_DIR/$2" ]; then export "$1=$(cat "$DATA_DIR/$2")"; fi
}

[ -f build/index.js ] || fail "no build/ in this checkout: run npm start (or npx vite build) first"
from_file DB_PORT db.port
[ -n "${DB_PORT:-}" ] || fail "no database port: run npm start first (or set DB_PORT)"
[ -n "${AUTH_SECRET:-}" ] || [ -s "$DATA_DIR/auth-secret" ] ||
	fail "no .data/auth-secret: run npm start first (or set AUTH_SECRET)"
from_file AUTH_SECRET auth-secret
# The fakes npm start runs, when they run; a deployment names its real services instead.
if [ -z "${SMTP_HOST:-}" ] && pid_alive smtp-fake; then
	export SMTP_HOST=127.0.0.1
	from_file SMTP_PORT smtp.port
	from_file MAILBOX_PORT mailbox.port
	export MAILBOX_URL="${MAILBOX_URL:-http://127.0.0.1:$MAILBOX_PORT}"
fi
if [ -z "${ECB_RATES_URL:-}" ] && pid_alive ecb-fake; then
	export ECB_RATES_URL="http://127.0.0.1:$(cat "$DATA_DIR/ecb.port")/stats/eurofxref/eurofxref-daily.xml"
fi
if [ -z "${STRIPE_API_URL:-}" ] && pid_alive stripe-fake; then
	from_file STRIPE_FAKE_PORT stripe.port
	export STRIPE_API_URL="http://127.0.0.1:$STRIPE_FAKE_PORT"
	from_file STRIPE_SECRET_KEY stripe-secret-key
	from_file STRIPE_WEBHOOK_SECRET stripe-webhook-secret
	register_payment_webhook "$ORIGIN"
fi
port_free "$PORT" || fail "port $PORT is taken: choose another with PORT=…"

step "Serving $ORIGIN against $DB_NAME on 127.0.0.1:$DB_PORT${DB_REPLICA_PORT:+ (reads from the replica on port $DB_REPLICA_PORT)}"
exec node "$APP_HEAP_FLAG" build
