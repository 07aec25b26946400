#!/usr/bin/env bash
# Local SMTP fake on loopback: scripts/smtp-fake.sh start|stop|status
#
# Runs scripts/smtp-fake.ts in the background (own session via setsid, so it outlives the
# shell that started it). `start` is idempotent: when the mailbox API already answers it
# does nothing. Pid file and log live under .data/ (git-ignored).
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the pid file and log go            (default: <repo>/.data)
#   SMTP_PORT           SMTP port on 127.0.0.1                    (default: 2525)
#   MAILBOX_PORT        HTTP JSON mailbox API on 127.0.0.1        (default: 2580)
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="${SLOTWISE_DATA_DIR:-$ROOT/.data}"
SMTP_PORT="${SMTP_PORT:-2525}"
MAILBOX_PORT="${MAILBOX_PORT:-2580}"
PIDFILE="$DATA_DIR/smtp-fake.pid"
LOGFILE="$DATA_DIR/smtp-fake.log"
HEALTH_URL="http://127.0.0.1:$MAILBOX_PORT/health"

say() { printf '[mail] %s\n' "$*"; }
die() { printf '[mail] FAILED: %s\n' "$*" >&2; exit 1; }

ping_mailbox() {
	if command -v curl >/dev/null 2>&1; then
		curl -fsS --max-time 1 "$HEALTH_URL" >/dev/null 2>&1
	else
		node -e "fetch(process.argv[1],{signal:AbortSignal.timeout(1000)}).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" "$HEALTH_URL"
	fi
}

port_taken() {
	(exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

# The pid is also the process-group id (setsid), so signals reach npx, tsx and node alike.
recorded_pid() {
	local pid
	pid="$(cat "$PIDFILE" 2>/dev/null || true)"
	if [ -n "$pid" ] && kill -0 -- "-$pid" 2>/dev/null; then echo "$pid"; fi
}

start() {
	mkdir -p "$DATA_DIR"
	if ping_mailbox; then
		say "already running (SMTP 127.0.0.1:$SMTP_PORT, mailbox http://127.0.0.1:$MAILBOX_PORT)"
		return
	fi
	local old
	old="$(recorded_pid)"
	if [ -n "$old" ]; then
		# Started but not answering yet (or wedged): give it the usual start-up time first.
		if wait_until_ready; then
			say "already running (pid $old)"
			return
		fi
		die "start the SMTP fake: pid $old does not answer on $HEALTH_URL (see $LOGFILE); run scripts/smtp-fake.sh stop"
	fi
	for port in "$SMTP_PORT" "$MAILBOX_PORT"; do
		if port_taken "$port"; then
			die "start the SMTP fake: port $port is taken by another process; set SMTP_PORT / MAILBOX_PORT"
		fi
	done
	say "starting SMTP fake on 127.0.0.1:$SMTP_PORT (mailbox http://127.0.0.1:$MAILBOX_PORT)"
	cd "$ROOT"
	rm -f "$PIDFILE"
	# The child writes its own pid: setsid forks when the caller leads a process group (job
	# control on), so $! would be the short-lived setsid, not the new session leader.
	SMTP_PORT="$SMTP_PORT" MAILBOX_PORT="$MAILBOX_PORT" PIDFILE="$PIDFILE" \
		setsid bash -c 'echo $$ >"$PIDFILE"; exec npx tsx scripts/smtp-fake.ts' </dev/null >"$LOGFILE" 2>&1 &
	wait_until_ready || die "start the SMTP fake: no answer after 20 s (see $LOGFILE)"
	say "ready"
}

wait_until_ready() {
	local i pid
	for i in $(seq 1 200); do
		if ping_mailbox; then return 0; fi
		pid="$(cat "$PIDFILE" 2>/dev/null || true)"
		# The process is already gone (port clash, syntax error...): stop waiting.
		if [ -n "$pid" ] && ! kill -0 "$pid" 2>/dev/null; then return 1; fi
		sleep 0.1
	done
	return 1
}

stop() {
	local pid i
	pid="$(recorded_pid)"
	if [ -z "$pid" ]; then
		rm -f "$PIDFILE"
		if ping_mailbox; then
			say "a mailbox answers on port $MAILBOX_PORT but was not started by this script; leaving it alone"
		else
			say "not running"
		fi
		return
	fi
	kill -TERM -- "-$pid" 2>/dev/null || true
	for i in $(seq 1 50); do
		kill -0 -- "-$pid" 2>/dev/null || break
		sleep 0.1
	done
	if kill -0 -- "-$pid" 2>/dev/null; then
		kill -KILL -- "-$pid" 2>/dev/null || true
	fi
	rm -f "$PIDFILE"
	say "stopped"
}

status() {
	if ping_mailbox; then
		say "running (SMTP 127.0.0.1:$SMTP_PORT, mailbox http://127.0.0.1:$MAILBOX_PORT)"
	else
		say "not running"
		return 3
	fi
}

case "${1:-}" in
start) start ;;
stop) stop ;;
status) status ;;
*)
	echo "usage: scripts/smtp-fake.sh start|stop|status" >&2
	exit 2
	;;
esac
