#!/usr/bin/env bash
# Local fake of the ECB's daily exchange-rate file on loopback: scripts/ecb-fake.sh start|stop|status
# Serves the real reference rates of 2 January 2024 (tests/fixtures/ecb/eurofxref-2024-01-02.xml)
# at http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml. Idempotent; see
# scripts/fake-service.sh.
#
# Environment (all optional):
#   SLOTWISE_DATA_DIR   where the pid file and log go            (default: <repo>/.data)
#   ECB_FAKE_PORT       HTTP port on 127.0.0.1                    (default: 2590)
ECB_FAKE_PORT="${ECB_FAKE_PORT:-2590}"
FAKE_TAG=ecb
FAKE_NAME=ecb-fake
FAKE_TITLE="the ECB rates fake"
FAKE_SCRIPT=scripts/ecb-fake.ts
FAKE_HEALTH="http://127.0.0.1:$ECB_FAKE_PORT/health"
FAKE_PORTS="$ECB_FAKE_PORT"
FAKE_WHERE="http://127.0.0.1:$ECB_FAKE_PORT/stats/eurofxref/eurofxref-daily.xml"
FAKE_ENV="ECB_FAKE_PORT=$ECB_FAKE_PORT"
source "$(dirname "${BASH_SOURCE[0]}")/fake-service.sh"
fake_service_main "$@"
