#!/usr/bin/env bash
# Local fake of the ECB's daily exchange-rate file on loopback: scripts/ecb-fake.sh start|stop|status
#
# Runs scripts/ecb-fake.ts in the background (own session via setsid, so it outlives the
# shell that started it). It serves the real reference rates of 2 January 2024
# (tests/fixtures/ecb/eurofxref-2024-01-02.xml) at
#   http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml
# `start` is idempotent: when the fake already answers it does nothing. Pid file and log live
# under .data/ (git-ignored).
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the pid file and log go            (default: <repo>/.data)
#   ECB_FAKE_PORT       HTTP port on 127.0.0.1                    (default: 2590)
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="${SLOTWISE_DATA_DIR:-$ROOT/.data}"
ECB_FAKE_PORT="${ECB_FAKE_PORT:-2590}"
PIDFILE="$DATA_DIR/ecb-fake.pid"
LOGFILE="$DATA_DIR/ecb-fake.log"
HEALTH_URL="http://127.0.0.1:$ECB_FAKE_PORT/health"
RATES_URL="http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml"

say() { printf '[ecb] %s\n' "$*"; }
die() { printf '[ecb] FAILED: %s\n' "$*" >&2; exit 1; }

ping_fake() {
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

wait_until_ready() {
	local i pid
	for i in $(seq 1 200); do
		if ping_fake; then return 0; fi
		pid="$(cat "$PIDFILE" 2>/dev/null || true)"
		# The process is already gone (port clash, syntax error...): stop waiting.
		if [ -n "$pid" ] && ! kill -0 "$pid" 2>/dev/null; then return 1; fi
		sleep 0.1
	done
	return 1
}

start() {
	mkdir -p "$DATA_DIR"
	if ping_fake; then
		say "already running ($RATES_URL)"
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
		die "start the ECB fake: pid $old does not answer on $HEALTH_URL (see $LOGFILE); run scripts/ecb-fake.sh stop"
	fi
	if port_taken "$ECB_FAKE_PORT"; then
		die "start the ECB fake: port $ECB_FAKE_PORT is taken by another process; set ECB_FAKE_PORT"
	fi
	say "starting the ECB rates fake on $RATES_URL"
	cd "$ROOT"
	rm -f "$PIDFILE"
	# The child writes its own pid: setsid forks when the caller leads a process group (job
	# control on), so $! would be the short-lived setsid, not the new session leader.
	ECB_FAKE_PORT="$ECB_FAKE_PORT" PIDFILE="$PIDFILE" \
		setsid bash -c 'echo $$ >"$PIDFILE"; exec npx tsx scripts/ecb-fake.ts' </dev/null >"$LOGFILE" 2>&1 &
	wait_until_ready || die "start the ECB fake: no answer after 20 s (see $LOGFILE)"
	say "ready"
}

stop() {
	local pid i
	pid="$(recorded_pid)"
	if [ -z "$pid" ]; then
		rm -f "$PIDFILE"
		if ping_fake; then
			say "a server answers on port $ECB_FAKE_PORT but was not started by this script; leaving it alone"
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
	if ping_fake; then
		say "running ($RATES_URL)"
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
	echo "usage: scripts/ecb-fake.sh start|stop|status" >&2
	exit 2
	;;
esac
