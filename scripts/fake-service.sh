# Shared by scripts/smtp-fake.sh and scripts/ecb-fake.sh: run a local fake (a tsx script)
# in the background on loopback, idempotently. Source it after setting:
#   FAKE_TAG      log prefix, e.g. mail
#   FAKE_NAME     file stem under .data/ and in messages, e.g. smtp-fake
#   FAKE_TITLE    what it is, for messages, e.g. "the SMTP fake"
#   FAKE_SCRIPT   the tsx entry point, e.g. scripts/smtp-fake.ts
#   FAKE_HEALTH   a URL that answers 2xx once it is ready
#   FAKE_PORTS    ports it binds on 127.0.0.1 (checked before starting)
#   FAKE_WHERE    one line saying where it listens
#   FAKE_ENV      "NAME=value ..." passed to the process
# then call: fake_service_main "$@"
# The process runs in its own session (setsid), so it outlives the shell that started it;
# the pid file and log live under .data/ (git-ignored).
set -euo pipefail

FAKE_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
FAKE_DATA_DIR="${SLOTWISE_DATA_DIR:-$FAKE_ROOT/.data}"
FAKE_PIDFILE="$FAKE_DATA_DIR/$FAKE_NAME.pid"
FAKE_LOGFILE="$FAKE_DATA_DIR/$FAKE_NAME.log"

say() { printf '[%s] %s\n' "$FAKE_TAG" "$*"; }
die() { printf '[%s] FAILED: %s\n' "$FAKE_TAG" "$*" >&2; exit 1; }

ping_fake() {
	if command -v curl >/dev/null 2>&1; then
		curl -fsS --max-time 1 "$FAKE_HEALTH" >/dev/null 2>&1
	else
		node -e "fetch(process.argv[1],{signal:AbortSignal.timeout(1000)}).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" "$FAKE_HEALTH"
	fi
}

port_taken() {
	(exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

# The pid is also the process-group id (setsid), so signals reach npx, tsx and node alike.
recorded_pid() {
	local pid
	pid="$(cat "$FAKE_PIDFILE" 2>/dev/null || true)"
	if [ -n "$pid" ] && kill -0 -- "-$pid" 2>/dev/null; then echo "$pid"; fi
}

wait_until_ready() {
	local i pid
	for i in $(seq 1 200); do
		if ping_fake; then return 0; fi
		pid="$(cat "$FAKE_PIDFILE" 2>/dev/null || true)"
		# The process is already gone (port clash, syntax error...): stop waiting.
		if [ -n "$pid" ] && ! kill -0 "$pid" 2>/dev/null; then return 1; fi
		sleep 0.1
	done
	return 1
}

fake_start() {
	mkdir -p "$FAKE_DATA_DIR"
	if ping_fake; then
		say "already running ($FAKE_WHERE)"
		return
	fi
	local old port
	old="$(recorded_pid)"
	if [ -n "$old" ]; then
		# Started but not answering yet (or wedged): give it the usual start-up time first.
		if wait_until_ready; then
			say "already running (pid $old)"
			return
		fi
		die "start $FAKE_TITLE: pid $old does not answer on $FAKE_HEALTH (see $FAKE_LOGFILE); run scripts/$FAKE_NAME.sh stop"
	fi
	for port in $FAKE_PORTS; do
		port_taken "$port" && die "start $FAKE_TITLE: port $port is taken by another process"
	done
	say "starting $FAKE_TITLE ($FAKE_WHERE)"
	cd "$FAKE_ROOT"
	rm -f "$FAKE_PIDFILE"
	# The child writes its own pid: setsid forks when the caller leads a process group (job
	# control on), so $! would be the short-lived setsid, not the new session leader.
	# shellcheck disable=SC2086
	env $FAKE_ENV PIDFILE="$FAKE_PIDFILE" FAKE_SCRIPT="$FAKE_SCRIPT" \
		setsid bash -c 'echo $$ >"$PIDFILE"; exec npx tsx "$FAKE_SCRIPT"' </dev/null >"$FAKE_LOGFILE" 2>&1 &
	wait_until_ready || die "start $FAKE_TITLE: no answer after 20 s (see $FAKE_LOGFILE)"
	say "ready"
}

fake_stop() {
	local pid i
	pid="$(recorded_pid)"
	if [ -z "$pid" ]; then
		rm -f "$FAKE_PIDFILE"
		if ping_fake; then
			say "something answers on $FAKE_HEALTH but was not started by this script; leaving it alone"
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
	kill -0 -- "-$pid" 2>/dev/null && kill -KILL -- "-$pid" 2>/dev/null || true
	rm -f "$FAKE_PIDFILE"
	say "stopped"
}

fake_status() {
	if ping_fake; then
		say "running ($FAKE_WHERE)"
	else
		say "not running"
		return 3
	fi
}

fake_service_main() {
	case "${1:-}" in
	start) fake_start ;;
	stop) fake_stop ;;
	status) fake_status ;;
	*)
		echo "usage: scripts/$FAKE_NAME.sh start|stop|status" >&2
		exit 2
		;;
	esac
}
