#!/usr/bin/env bash
# Local SMTP fake on loopback: scripts/smtp-fake.sh start|stop|status
# Keeps every message in memory and serves them as JSON (the dev mailbox page and tests
# read them). Idempotent; see scripts/fake-service.sh.
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the pid file and log go            (default: <repo>/.data)
#   SMTP_PORT           SMTP port on 127.0.0.1                    (default: 2525)
#   MAILBOX_PORT        HTTP JSON mailbox API on 127.0.0.1        (default: 2580)
SMTP_PORT="${SMTP_PORT:-2525}"
MAILBOX_PORT="${MAILBOX_PORT:-2580}"
FAKE_TAG=mail
FAKE_NAME=smtp-fake
FAKE_TITLE="the SMTP fake"
FAKE_SCRIPT=scripts/smtp-fake.ts
FAKE_HEALTH="http://127.0.0.1:$MAILBOX_PORT/health"
FAKE_PORTS="$SMTP_PORT $MAILBOX_PORT"
FAKE_WHERE="SMTP 127.0.0.1:$SMTP_PORT, mailbox http://127.0.0.1:$MAILBOX_PORT"
FAKE_ENV="SMTP_PORT=$SMTP_PORT MAILBOX_PORT=$MAILBOX_PORT"
source "$(dirname "${BASH_SOURCE[0]}")/fake-service.sh"
fake_service_main "$@"
