#!/usr/bin/env bash
# A MariaDB read replica of the project-local primary, on loopback:
#   scripts/db-replica.sh start|stop|status
#
# Binlog replication from Debian's packages: its own datadir (.data/mariadb-replica), its own
# free port, read_only=ON, seeded from a consistent dump of the primary taken with
# `mariadb-dump --single-transaction --master-data --gtid`, then following the primary with
# `CHANGE MASTER TO … MASTER_USE_GTID=slave_pos`. `start` is idempotent: a replica that
# already exists is only started (it resumes from its own GTID position); to seed it afresh,
# stop it and delete its datadir. The primary must run with the binary log on
# (scripts/db.sh starts it so); the app user exists on the replica too, so the app can
# read from it, but read_only stops it from writing there.
#
# The app reads from it when DB_REPLICA_PORT (and DB_REPLICA_HOST, default 127.0.0.1) is
# set: see src/lib/server/db/connection.ts and docs/deployment.md.
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the primary's socket is and the replica's datadir goes (<repo>/.data)
#   DB_PORT             the primary's port (default: asked over its socket)
#   DB_REPLICA_PORT     the replica's port (default: the last one used, else any free port)
#   DB_USER / DB_PASSWORD           the application's account (slotwise / slotwise-dev)
#   DB_REPL_USER / DB_REPL_PASSWORD the replication account on the primary
#                                   (slotwise_repl / slotwise-repl-dev)
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

PRIMARY_SOCKET="$DATA_DIR/mariadb.sock"
REPLICA_DIR="$DATA_DIR/mariadb-replica"
REPLICA_SOCKET="$DATA_DIR/mariadb-replica.sock"
REPLICA_PIDFILE="$DATA_DIR/mariadb-replica.pid"
REPLICA_ERRLOG="$DATA_DIR/mariadb-replica.err"
APP_USER="${DB_USER:-slotwise}"
APP_PASSWORD="${DB_PASSWORD:-slotwise-dev}"
REPL_USER="${DB_REPL_USER:-slotwise_repl}"
REPL_PASSWORD="${DB_REPL_PASSWORD:-slotwise-repl-dev}"

say() { printf '[db-replica] %s\n' "$*"; }
die() { printf '[db-replica] FAILED: %s\n' "$*" >&2; exit 1; }

primary() { mariadb --no-defaults --socket="$PRIMARY_SOCKET" -uroot "$@"; }
replica() { mariadb --no-defaults --socket="$REPLICA_SOCKET" -uroot "$@"; }
replica_up() { mariadb-admin --no-defaults --socket="$REPLICA_SOCKET" -uroot ping >/dev/null 2>&1; }

wait_for_exit() {
	local pid="$1" i
	for i in $(seq 1 300); do
		kill -0 "$pid" 2>/dev/null || return 0
		sleep 0.1
	done
	return 1
}

# Dumps every application database of the primary with its GTID position and loads it into
# the fresh replica. --single-transaction gives one consistent InnoDB snapshot;
# --master-data takes a global read lock only for the moment it reads the position.
seed() {
	local databases
	databases="$(primary -N -e "SELECT schema_name FROM information_schema.schemata
		WHERE schema_name NOT IN ('mysql','information_schema','performance_schema','sys')" | tr '\n' ' ')"
	[ -n "${databases// /}" ] || die "seed: the primary has no application database"
	say "seeding from the primary's databases: $databases"
	# shellcheck disable=SC2086
	mariadb-dump --no-defaults --socket="$PRIMARY_SOCKET" -uroot --single-transaction \
		--master-data=1 --gtid --routines --triggers --events --databases $databases |
		replica || die "seed: load the primary's dump"
}

# The app's account on the replica (for reads), created locally: replicated CREATE USER IF
# NOT EXISTS / GRANT statements from scripts/db.sh then find it present and change nothing.
create_app_user() {
	local sql="" host name
	for host in 127.0.0.1 localhost; do
		sql+="CREATE USER IF NOT EXISTS '$APP_USER'@'$host' IDENTIFIED BY '$APP_PASSWORD';"
		for name in $(replica -N -e "SELECT schema_name FROM information_schema.schemata
			WHERE schema_name NOT IN ('mysql','information_schema','performance_schema','sys')"); do
			sql+="GRANT ALL PRIVILEGES ON \`$name\`.* TO '$APP_USER'@'$host';"
		done
	done
	replica -e "$sql" || die "create the app user on the replica"
}

start() {
	mkdir -p "$DATA_DIR"
	primary -e 'SELECT 1' >/dev/null 2>&1 || die "the primary is not running (bash scripts/db.sh start)"
	local primary_port log_bin
	primary_port="${DB_PORT:-$(primary -N -e 'SELECT @@port')}"
	log_bin="$(primary -N -e 'SELECT @@log_bin')"
	[ "$log_bin" = "1" ] ||
		die "the primary runs without its binary log (started before it was on): restart it with bash scripts/db.sh stop && bash scripts/db.sh start"

	if replica_up; then
		DB_REPLICA_PORT="$(replica -N -e 'SELECT @@port')"
		say "already running on 127.0.0.1:$DB_REPLICA_PORT"
		return
	fi
	choose_port DB_REPLICA_PORT db-replica 3308
	if ! port_free "$DB_REPLICA_PORT"; then
		die "port $DB_REPLICA_PORT is taken by another process; set DB_REPLICA_PORT"
	fi
	if [ -f "$REPLICA_PIDFILE" ]; then
		local old
		old="$(cat "$REPLICA_PIDFILE" 2>/dev/null || true)"
		if [ -n "$old" ] && ! wait_for_exit "$old"; then
			die "an earlier replica (pid $old) still holds $REPLICA_DIR"
		fi
		rm -f "$REPLICA_PIDFILE"
	fi
	local fresh=0
	if [ ! -d "$REPLICA_DIR/mysql" ]; then
		say "initialising datadir $REPLICA_DIR"
		mariadb-install-db --no-defaults --user="$(id -un)" --datadir="$REPLICA_DIR" \
			--auth-root-authentication-method=socket --skip-test-db --skip-name-resolve \
			>"$DATA_DIR/install-db-replica.log" 2>&1 ||
			die "initialise the datadir (see $DATA_DIR/install-db-replica.log)"
		fresh=1
	fi
	say "starting the replica on 127.0.0.1:$DB_REPLICA_PORT"
	# read_only: only the replication thread (and root) may write; the app's account cannot.
	# No binary log of its own: this replica serves reads and is not chained further.
	setsid "$(command -v mariadbd 2>/dev/null || echo /usr/sbin/mariadbd)" --no-defaults \
		--user="$(id -un)" --datadir="$REPLICA_DIR" --bind-address=127.0.0.1 \
		--port="$DB_REPLICA_PORT" --socket="$REPLICA_SOCKET" --pid-file="$REPLICA_PIDFILE" \
		--log-error="$REPLICA_ERRLOG" --skip-name-resolve --skip-log-bin \
		--server-id="${DB_REPLICA_SERVER_ID:-2}" --read-only=ON --gtid-strict-mode=1 \
		--relay-log=slotwise-relay-bin --innodb-flush-log-at-trx-commit=1 \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		</dev/null >/dev/null 2>&1 &
	local i
	for i in $(seq 1 300); do
		replica_up && break
		sleep 0.1
	done
	replica_up || die "no answer after 30 s (see $REPLICA_ERRLOG)"

	if [ "$fresh" -eq 1 ]; then
		# The replication account first, so its own creation is already behind the dump's position.
		primary -e "CREATE USER IF NOT EXISTS '$REPL_USER'@'127.0.0.1' IDENTIFIED BY '$REPL_PASSWORD';
			ALTER USER '$REPL_USER'@'127.0.0.1' IDENTIFIED BY '$REPL_PASSWORD';
			GRANT REPLICATION SLAVE ON *.* TO '$REPL_USER'@'127.0.0.1';" ||
			die "create the replication account on the primary"
		seed
		create_app_user
		replica -e "CHANGE MASTER TO MASTER_HOST='127.0.0.1', MASTER_PORT=$primary_port,
			MASTER_USER='$REPL_USER', MASTER_PASSWORD='$REPL_PASSWORD',
			MASTER_CONNECT_RETRY=1, MASTER_USE_GTID=slave_pos; START SLAVE;" ||
			die "start replication"
	fi
	for i in $(seq 1 100); do
		status >/dev/null 2>&1 && break
		sleep 0.1
	done
	status >/dev/null || { status || true; die "replication did not start (see $REPLICA_ERRLOG)"; }
	say "ready on 127.0.0.1:$DB_REPLICA_PORT, following 127.0.0.1:$primary_port (export DB_REPLICA_PORT=$DB_REPLICA_PORT)"
}

stop() {
	if ! replica_up; then
		say "not running"
		return
	fi
	local pid
	pid="$(cat "$REPLICA_PIDFILE" 2>/dev/null || true)"
	mariadb-admin --no-defaults --socket="$REPLICA_SOCKET" -uroot shutdown || die "stop the replica"
	[ -n "$pid" ] && wait_for_exit "$pid"
	say "stopped"
}

# Exit 0 when both replication threads run, 3 when the replica is down, 1 when it runs but
# does not replicate (the last error is printed).
status() {
	if ! replica_up; then
		say "not running"
		return 3
	fi
	local info io sql lag error port
	info="$(replica -e 'SHOW SLAVE STATUS\G')"
	io="$(sed -n 's/^ *Slave_IO_Running: //p' <<<"$info")"
	sql="$(sed -n 's/^ *Slave_SQL_Running: //p' <<<"$info")"
	lag="$(sed -n 's/^ *Seconds_Behind_Master: //p' <<<"$info")"
	error="$(sed -n 's/^ *Last_\(IO\|SQL\)_Error: \(..*\)$/\2/p' <<<"$info" | head -1)"
	port="$(replica -N -e 'SELECT @@port')"
	say "running on 127.0.0.1:$port (datadir $REPLICA_DIR): io=${io:-No} sql=${sql:-No} behind=${lag:-?} s gtid=$(replica -N -e 'SELECT @@gtid_slave_pos')"
	if [ "$io" != "Yes" ] || [ "$sql" != "Yes" ]; then
		[ -n "$error" ] && say "last error: $error"
		return 1
	fi
}

case "${1:-}" in
start) start ;;
stop) stop ;;
status) status ;;
*)
	echo "usage: scripts/db-replica.sh start|stop|status" >&2
	exit 2
	;;
esac
