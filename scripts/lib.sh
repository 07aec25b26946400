# Shared steps of start.sh, test.sh and dev.sh. Each step names itself, so a failure says
# which step broke.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

step() { printf '\n==> %s\n' "$*"; }
fail() { printf '\nFAILED at step: %s\n' "$*" >&2; exit 1; }

as_root() { if [ "$(id -u)" -eq 0 ]; then "$@"; else sudo "$@"; fi; }

APT_UPDATED=0
apt_install() {
	command -v apt-get >/dev/null 2>&1 || fail "install $* (apt-get not available; install it by hand)"
	if [ "$APT_UPDATED" -eq 0 ]; then
		as_root apt-get update -qq >/dev/null || fail "apt-get update"
		APT_UPDATED=1
	fi
	DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq "$@" >/dev/null || fail "apt-get install $*"
}

# npm ci when node_modules is missing or older than the lockfile.
ensure_node_modules() {
	local stamp=node_modules/.slotwise-lock.sha
	local want
	want="$(sha1sum package-lock.json | cut -d' ' -f1)"
	if [ ! -d node_modules ] || [ "$(cat "$stamp" 2>/dev/null)" != "$want" ]; then
		step "Installing npm packages (npm ci)"
		npm ci --no-audit --no-fund || fail "npm ci"
		echo "$want" >"$stamp"
	fi
}

ensure_mariadb_package() {
	if ! command -v mariadbd >/dev/null 2>&1 && [ ! -x /usr/sbin/mariadbd ]; then
		step "Installing mariadb-server from Debian's packages"
		apt_install mariadb-server
	fi
}

ensure_chromium() {
	if [ ! -x /usr/bin/chromium ]; then
		step "Installing chromium from Debian's packages (for end-to-end tests)"
		apt_install chromium
	fi
}

start_db() {
	step "Starting MariaDB on 127.0.0.1:${DB_PORT:-3307}"
	bash scripts/db.sh start || fail "start MariaDB"
}

# The local SMTP fake (scripts/smtp-fake.sh) unless the environment names a real SMTP
# server: a deployment sets SMTP_HOST itself, so no fake runs and MAILBOX_URL stays unset
# (which also hides the dev-only /dev/mailbox page).
start_mail_fake() {
	if [ -n "${SMTP_HOST:-}" ]; then
		step "Using the SMTP server $SMTP_HOST:${SMTP_PORT:-2525} from the environment (no local mail fake)"
		return
	fi
	export SMTP_HOST=127.0.0.1
	export SMTP_PORT="${SMTP_PORT:-2525}"
	export MAILBOX_URL="http://127.0.0.1:${MAILBOX_PORT:-2580}"
	step "Starting the local SMTP fake on 127.0.0.1:$SMTP_PORT (mailbox $MAILBOX_URL)"
	bash scripts/smtp-fake.sh start || fail "start the SMTP fake"
}

# The local fake of the ECB's daily exchange-rate file (scripts/ecb-fake.sh) unless the
# environment names a rates URL: a deployment sets ECB_RATES_URL itself (normally the ECB's
# public https://www.ecb.europa.eu/stats/eurofxref/eurofxref-daily.xml), so no fake runs.
start_ecb_fake() {
	if [ -n "${ECB_RATES_URL:-}" ]; then
		step "Using the exchange rates at $ECB_RATES_URL from the environment (no local ECB fake)"
		return
	fi
	export ECB_FAKE_PORT="${ECB_FAKE_PORT:-2590}"
	export ECB_RATES_URL="http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml"
	step "Starting the local ECB rates fake on $ECB_RATES_URL (rates of 2 January 2024)"
	bash scripts/ecb-fake.sh start || fail "start the ECB rates fake"
}

# migrate_and_seed DB_NAME
migrate_and_seed() {
	step "Migrating and seeding database $1"
	DB_NAME="$1" npx tsx scripts/migrate.ts up || fail "migrate $1"
	DB_NAME="$1" npx tsx scripts/seed.ts up || fail "seed $1"
}

# A stable Auth.js secret for this checkout (kept in .data/, never committed). A deployment
# sets AUTH_SECRET itself (at least 32 random characters).
ensure_auth_secret() {
	if [ -z "${AUTH_SECRET:-}" ]; then
		mkdir -p .data
		[ -s .data/auth-secret ] || node -e "process.stdout.write(require('crypto').randomBytes(32).toString('base64url'))" >.data/auth-secret
		AUTH_SECRET="$(cat .data/auth-secret)"
		export AUTH_SECRET
	fi
}
