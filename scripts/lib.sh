# Shared steps of start.sh, test.sh and dev.sh. Each step names itself, so a failure says
# which step broke.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$ROOT"

step() { printf '\n==> %s\n' "$*"; }
fail() { printf '\nFAILED at step: %s\n' "$*" >&2; exit 1; }

# The app's V8 heap ceiling. Without one, V8 on a machine with plenty of RAM lets the heap grow
# lazily: the app's resident memory reached about 600 MB under 50 connections while its live
# heap stayed near 60 MB (bench:scale, docs/benchmarks.md). With the ceiling it stays near
# 200 MB at the same throughput; the largest job in the app (the stored guide prices of
# 10,000 guides) peaked at 61 MB of heap. bench/lib/harness.ts starts the app the same way.
APP_HEAP_FLAG="--max-old-space-size=384"

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

DATA_DIR="${SLOTWISE_DATA_DIR:-$ROOT/.data}"

# Ports: two checkouts (or a developer's own instance) on one machine must not collide, so
# every port this script starts something on is chosen, not assumed. An explicit variable
# always wins; otherwise the port this checkout used last, while its own service still holds
# it or it is free; otherwise the usual default when free; otherwise any free port. The
# choice is remembered in .data/<name>.port.
port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
# A port nobody listens on now, drawn from 20000-32767: below Linux's ephemeral range
# (32768-60999), so an outgoing connection (to MariaDB, the fakes) cannot take it between
# this choice and the listen minutes later, as a port the kernel handed out could be.
free_port() {
	node -e "
const net = require('net');
const tryPort = (n) => {
  const port = 20000 + Math.floor(Math.random() * 12768);
  const s = net.createServer();
  s.once('error', () => (n > 0 ? tryPort(n - 1) : process.exit(1)));
  s.listen(port, '127.0.0.1', () => s.close(() => process.stdout.write(String(port))));
};
tryPort(50);"
}
# pid_alive STEM: the process group recorded in .data/STEM.pid still runs.
pid_alive() {
	local pid
	pid="$(cat "$DATA_DIR/$1.pid" 2>/dev/null || true)"
	[ -n "$pid" ] && kill -0 -- "-$pid" 2>/dev/null
}
# choose_port VAR STEM DEFAULT [OURS_RUNNING_COMMAND...]
choose_port() {
	local var="$1" stem="$2" default="$3" saved port
	shift 3
	[ -n "${!var:-}" ] && return 0
	mkdir -p "$DATA_DIR"
	saved="$(cat "$DATA_DIR/$stem.port" 2>/dev/null || true)"
	if [ $# -gt 0 ] && "$@"; then
		port="${saved:-$default}"
	elif [ -n "$saved" ] && port_free "$saved"; then
		port="$saved"
	elif port_free "$default"; then
		port="$default"
	else
		port="$(free_port)"
	fi
	echo "$port" >"$DATA_DIR/$stem.port"
	export "$var=$port"
}
# The port our own MariaDB listens on, asked over its socket (empty when it is not running).
our_db_port() {
	mariadb --no-defaults --socket="$DATA_DIR/mariadb.sock" -uroot -N -e 'SELECT @@port' 2>/dev/null || true
}

start_db() {
	if [ -z "${DB_PORT:-}" ]; then
		local running
		running="$(our_db_port)"
		if [ -n "$running" ]; then
			export DB_PORT="$running"
			echo "$running" >"$DATA_DIR/db.port"
		else
			choose_port DB_PORT db 3307
		fi
	fi
	step "Starting MariaDB on 127.0.0.1:$DB_PORT"
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
	choose_port SMTP_PORT smtp 2525 pid_alive smtp-fake
	choose_port MAILBOX_PORT mailbox 2580 pid_alive smtp-fake
	export MAILBOX_URL="http://127.0.0.1:$MAILBOX_PORT"
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
	choose_port ECB_FAKE_PORT ecb 2590 pid_alive ecb-fake
	export ECB_RATES_URL="http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml"
	step "Starting the local ECB rates fake on $ECB_RATES_URL (rates of 2 January 2024)"
	bash scripts/ecb-fake.sh start || fail "start the ECB rates fake"
}

# The local fake of the payment provider's API (scripts/stripe-fake.sh) unless the environment
# names the real one: a deployment sets STRIPE_API_URL (normally https://api.stripe.com), its
# own STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET, so no fake runs. For the fake, a test key
# and a webhook secret are made once per checkout and kept in .data/ (never committed).
start_payment_fake() {
	if [ -n "${STRIPE_API_URL:-}" ]; then
		step "Using the payment provider at $STRIPE_API_URL from the environment (no local fake)"
		return
	fi
	mkdir -p "$DATA_DIR"
	[ -s "$DATA_DIR/stripe-secret-key" ] || node -e "process.stdout.write('sk_test_fake_'+require('crypto').randomBytes(24).toString('hex'))" >"$DATA_DIR/stripe-secret-key"
	[ -s "$DATA_DIR/stripe-webhook-secret" ] || node -e "process.stdout.write('whsec_'+require('crypto').randomBytes(24).toString('base64url'))" >"$DATA_DIR/stripe-webhook-secret"
	STRIPE_SECRET_KEY="$(cat "$DATA_DIR/stripe-secret-key")"
	STRIPE_WEBHOOK_SECRET="$(cat "$DATA_DIR/stripe-webhook-secret")"
	export STRIPE_SECRET_KEY STRIPE_WEBHOOK_SECRET
	choose_port STRIPE_FAKE_PORT stripe 2600 pid_alive stripe-fake
	export STRIPE_API_URL="http://127.0.0.1:$STRIPE_FAKE_PORT"
	step "Starting the local payment provider fake on $STRIPE_API_URL"
	bash scripts/stripe-fake.sh start || fail "start the payment provider fake"
}

# register_payment_webhook ORIGIN: tells the local fake to send its events to this app, as
# one does once in the provider's dashboard for a deployment. Harmless when repeated.
register_payment_webhook() {
	[ -n "${STRIPE_FAKE_PORT:-}" ] || return 0
	node -e "fetch(process.argv[1]+'/v1/webhook_endpoints',{method:'POST',headers:{authorization:'Bearer '+process.env.STRIPE_SECRET_KEY,'content-type':'application/x-www-form-urlencoded'},body:new URLSearchParams({url:process.argv[2]+'/api/payments/webhook'})}).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" \
		"$STRIPE_API_URL" "$1" || fail "register the webhook endpoint with the payment provider fake"
}

# migrate_and_seed DB_NAME
migrate_and_seed() {
	step "Migrating and seeding database $1"
	# Seeders reuse app services, which import through SvelteKit's $lib alias: tsx finds it in
	# the tsconfig that `svelte-kit sync` writes, and a fresh clone has none yet.
	npx svelte-kit sync || fail "svelte-kit sync"
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
