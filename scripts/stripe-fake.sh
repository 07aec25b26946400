#!/usr/bin/env bash
# Local fake of the payment provider's API on loopback: scripts/stripe-fake.sh start|stop|status
# Checkout sessions, a hosted test "pay" page, refunds, and webhooks signed like the provider's
# (see scripts/stripe-fake.ts). Idempotent; see scripts/fake-service.sh.
#
# Environment:
#   STRIPE_FAKE_PORT       HTTP port on 127.0.0.1                    (default: 2600)
#   STRIPE_SECRET_KEY      the API key the fake accepts               (required)
#   STRIPE_WEBHOOK_SECRET  the "whsec_…" secret webhooks are signed with (required)
STRIPE_FAKE_PORT="${STRIPE_FAKE_PORT:-2600}"
: "${STRIPE_SECRET_KEY:?set STRIPE_SECRET_KEY (npm start and npm test make one in .data/)}"
: "${STRIPE_WEBHOOK_SECRET:?set STRIPE_WEBHOOK_SECRET (npm start and npm test make one in .data/)}"
FAKE_TAG=payments
FAKE_NAME=stripe-fake
FAKE_TITLE="the payment provider fake"
FAKE_SCRIPT=scripts/stripe-fake.ts
FAKE_HEALTH="http://127.0.0.1:$STRIPE_FAKE_PORT/health"
FAKE_PORTS="$STRIPE_FAKE_PORT"
FAKE_WHERE="http://127.0.0.1:$STRIPE_FAKE_PORT"
# The two secrets reach the process through the exported environment, never its command line.
FAKE_ENV="STRIPE_FAKE_PORT=$STRIPE_FAKE_PORT"
source "$(dirname "${BASH_SOURCE[0]}")/fake-service.sh"
fake_service_main "$@"
