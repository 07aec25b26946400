#!/usr/bin/env bash
# npm test: the same set-up as npm start against the test databases, then every check:
# svelte-check, vitest (unit + integration on the real MariaDB), the production build and
# Playwright in Debian's Chromium. Ends with one line "N passed, N failed".
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

export LOG_LEVEL="${LOG_LEVEL:-silent}"
REPORTS="$ROOT/.reports"
rm -rf "$REPORTS"
mkdir -p "$REPORTS"

ensure_node_modules
ensure_mariadb_package
ensure_chromium
start_db
start_mail_fake
start_ecb_fake
start_payment_fake
ensure_auth_secret
# Integration tests migrate slotwise_test themselves (globalSetup) and truncate between tests;
# end-to-end tests read the seeded demo in slotwise_e2e.
bash scripts/db.sh recreate slotwise_e2e >/dev/null || fail "recreate slotwise_e2e"
# Its photo files go with it (src/lib/server/storage: one folder per database).
rm -rf "$ROOT/.data/uploads/slotwise_e2e"
migrate_and_seed slotwise_e2e

status=0
record() { # record NAME PASSED(0|1)
	if [ "$2" -eq 0 ]; then echo "$1 0" >>"$REPORTS/extra-failed"; else echo "$1 1" >>"$REPORTS/extra-passed"; fi
}

step "Formatting and lint (Prettier, ESLint)"
if npx prettier --check . >"$REPORTS/prettier.log" 2>&1; then
	record prettier 1
else
	grep -v '^Checking' "$REPORTS/prettier.log" | tail -20
	record prettier 0
	status=1
fi
if npx eslint . --max-warnings 0; then
	record eslint 1
else
	record eslint 0
	status=1
fi

step "Type check (svelte-check)"
if npx svelte-kit sync && npx svelte-check --tsconfig ./tsconfig.json --threshold error --output human; then
	record svelte-check 1
else
	record svelte-check 0
	status=1
fi

step "Unit and integration tests (vitest)"
if ! DB_NAME=slotwise_test npx vitest run --reporter=default --reporter=json \
	--outputFile.json="$REPORTS/vitest.json"; then
	status=1
fi

step "Production build"
if npx vite build >"$REPORTS/build.log" 2>&1; then
	record build 1
	step "End-to-end tests (Playwright, Debian's Chromium)"
	# The app under end-to-end test gets a port of its own, chosen just before it starts (a
	# port chosen 20 minutes earlier may have been taken by then), and the payment fake is told
	# where to send its webhooks.
	export E2E_PORT="${E2E_PORT:-$(free_port)}"
	# Processes the end-to-end tests start themselves inherit this: no scheduled passes under
	# running tests (the scheduler has its own integration tests with a controlled clock).
	export SCHEDULER="${SCHEDULER:-off}"
	register_payment_webhook "http://127.0.0.1:$E2E_PORT"
	if ! DB_NAME=slotwise_e2e PLAYWRIGHT_JSON_OUTPUT_NAME="$REPORTS/playwright.json" \
		npx playwright test --config tests/playwright.config.ts --reporter=list,json; then
		status=1
	fi
else
	tail -40 "$REPORTS/build.log"
	record build 0
	status=1
fi

step "Summary"
node scripts/test-summary.mjs "$REPORTS" || status=1
exit "$status"
