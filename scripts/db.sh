#!/usr/bin/env bash
# Project-local MariaDB on loopback: scripts/db.sh start|stop|status
#
# The datadir lives under .data/ (git-ignored), so nothing touches a system-wide server.
# `start` is idempotent: when the server already answers it only makes sure the databases
# and the app user exist. Debian's durable InnoDB defaults (flush at every commit,
# doublewrite) are kept on purpose.
#
# The binary log is always on (GTID, row format, synced at every commit): a replica
# (scripts/db-replica.sh) can attach at any time without restarting this server, and the
# crash test runs with the configuration a deployment uses. Why always rather than only with
# a replica: see "Binary log" in docs/deployment.md (it costs an fsync per commit group,
# measured by `npm run bench:binlog`). Old binlog files go after a day.
# log_bin_trust_function_creators: with the binary log on, MariaDB refuses CREATE TRIGGER
# from an account without SUPER, lest a non-deterministic trigger replay differently on a
# replica. Row-format logging records the rows a trigger changed, not the statement, so
# that cannot happen here; the app's account (and the tests that add a failing trigger to
# prove a transaction rolls back) may create triggers as before.
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the datadir, socket and logs go      (default: <repo>/.data)
#   DB_PORT             TCP port on 127.0.0.1                       (default: 3307)
#   DB_USER / DB_PASSWORD  the application's account              (default: slotwise / slotwise-dev)
#   DB_NAMES            databases to create                         (default: slotwise slotwise_test slotwise_e2e)
#   DB_SERVER_ID        the binary log's server id                  (default: 1; a replica uses another)
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="${SLOTWISE_DATA_DIR:-$ROOT/.data}"
PORT="${DB_PORT:-3307}"
APP_USER="${DB_USER:-slotwise}"
APP_PASSWORD="${DB_PASSWORD:-slotwise-dev}"
DB_NAMES="${DB_NAMES:-slotwise slotwise_test slotwise_e2e}"
DATADIR="$DATA_DIR/mariadb"
SOCKET="$DATA_DIR/mariadb.sock"
PIDFILE="$DATA_DIR/mariadb.pid"
ERRLOG="$DATA_DIR/mariadb.err"

say() { printf '[db] %s\n' "$*"; }
die() { printf '[db] FAILED: %s\n' "$*" >&2; exit 1; }

ping_db() {
	mariadb-admin --no-defaults --socket="$SOCKET" -uroot ping >/dev/null 2>&1
}

ensure_installed() {
	if command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]; then return; fi
	command -v apt-get >/dev/null 2>&1 || die "install MariaDB: mariadbd is missing and apt-get is not available"
	say "installing mariadb-server from Debian's packages (about 30 s)"
	local sudo=""
	[ "$(id -u)" -eq 0 ] || sudo="sudo"
	if ! $sudo apt-get install -y -qq mariadb-server >/dev/null 2>&1; then
		$sudo apt-get update -qq >/dev/null 2>&1 || die "install MariaDB: apt-get update failed"
		DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq mariadb-server >/dev/null ||
			die "install MariaDB: apt-get install mariadb-server failed"
	fi
}

mariadbd_bin() {
	command -v mariadbd 2>/dev/null || echo /usr/sbin/mariadbd
}

wait_for_pid_exit() {
	local pid="$1" i
	for i in $(seq 1 300); do
		kill -0 "$pid" 2>/dev/null || return 0
		sleep 0.1
	done
	return 1
}

create_databases() {
	local sql=""
	for name in $DB_NAMES; do
		sql+="CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
	done
	for host in 127.0.0.1 localhost; do
		sql+="CREATE USER IF NOT EXISTS '$APP_USER'@'$host' IDENTIFIED BY '$APP_PASSWORD';"
		sql+="ALTER USER '$APP_USER'@'$host' IDENTIFIED BY '$APP_PASSWORD';"
		for name in $DB_NAMES; do
			sql+="GRANT ALL PRIVILEGES ON \`$name\`.* TO '$APP_USER'@'$host';"
		done
	done
	mariadb --no-defaults --socket="$SOCKET" -uroot -e "$sql" || die "create databases and the app user"
}

start() {
	mkdir -p "$DATA_DIR"
	if ping_db; then
		say "already running on 127.0.0.1:$PORT"
		create_databases
		return
	fi
	ensure_installed
	if (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null; then
		die "start MariaDB: port $PORT is taken by another process (another checkout's server?); set DB_PORT"
	fi
	# A server that is shutting down still holds the datadir: wait for it to go.
	if [ -f "$PIDFILE" ]; then
		local old
		old="$(cat "$PIDFILE" 2>/dev/null || true)"
		if [ -n "$old" ] && ! wait_for_pid_exit "$old"; then
			die "start MariaDB: an earlier server (pid $old) still holds $DATADIR"
		fi
		rm -f "$PIDFILE"
	fi
	if [ ! -d "$DATADIR/mysql" ]; then
		say "initialising datadir $DATADIR"
		mariadb-install-db --no-defaults --user="$(id -un)" --datadir="$DATADIR" \
			--auth-root-authentication-method=socket --skip-test-db --skip-name-resolve \
			>"$DATA_DIR/install-db.log" 2>&1 || die "initialise the datadir (see $DATA_DIR/install-db.log)"
	fi
	say "starting MariaDB on 127.0.0.1:$PORT"
	# setsid: the server outlives the shell that started it and ignores its signals.
	setsid "$(mariadbd_bin)" --no-defaults --user="$(id -un)" --datadir="$DATADIR" \
		--bind-address=127.0.0.1 --port="$PORT" --socket="$SOCKET" --pid-file="$PIDFILE" \
		--log-error="$ERRLOG" --skip-name-resolve \
		--log-bin=slotwise-bin --server-id="${DB_SERVER_ID:-1}" --sync-binlog=1 \
		--binlog-format=ROW --gtid-strict-mode=1 --binlog-expire-logs-seconds=86400 \
		--max-binlog-size=64M --innodb-flush-log-at-trx-commit=1 \
		--log-bin-trust-function-creators=1 \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		</dev/null >/dev/null 2>&1 &
	local i
	for i in $(seq 1 300); do
		ping_db && break
		sleep 0.1
	done
	ping_db || die "start MariaDB: no answer after 30 s (see $ERRLOG)"
	create_databases
	say "ready on 127.0.0.1:$PORT"
}

stop() {
	if ! ping_db; then
		say "not running"
		return
	fi
	local pid
	pid="$(cat "$PIDFILE" 2>/dev/null || true)"
	mariadb-admin --no-defaults --socket="$SOCKET" -uroot shutdown || die "stop MariaDB"
	[ -n "$pid" ] && wait_for_pid_exit "$pid"
	say "stopped"
}

status() {
	if ping_db; then
		say "running on 127.0.0.1:$PORT (datadir $DATADIR)"
	else
		say "not running"
		return 3
	fi
}

# Drops and creates one database, so a test run starts from an empty schema.
recreate() {
	local name="${1:?usage: scripts/db.sh recreate NAME}"
	ping_db || die "recreate $name: MariaDB is not running"
	mariadb --no-defaults --socket="$SOCKET" -uroot -e "DROP DATABASE IF EXISTS \`$name\`;" || die "drop $name"
	DB_NAMES="$name" create_databases
}

case "${1:-}" in
start) start ;;
recreate) recreate "${2:-}" ;;
stop) stop ;;
status) status ;;
*)
	echo "usage: scripts/db.sh start|stop|status|recreate NAME" >&2
	exit 2
	;;
esac
