#!/usr/bin/env bash
# npm run test:reliability: the reliability proofs of docs/RELIABILITY.md at full size, on the
# same throwaway PostgreSQL and fakes as npm test (set TEST_*_PORT as for npm test). Prints the
# figures the document quotes. Sizes: SYNC_MODEL_RUNS (default 1000), FUZZ_RUNS (default 100000),
# ROUTE_FUZZ_RUNS (bodies per endpoint in the fuzz of every route, default 200).
set -euo pipefail
cd "$(dirname "$0")/.."
export SYNC_MODEL_RUNS="${SYNC_MODEL_RUNS:-1000}"
export FUZZ_RUNS="${FUZZ_RUNS:-100000}"
export ROUTE_FUZZ_RUNS="${ROUTE_FUZZ_RUNS:-200}"
TEST_STEPS="integration" INTEGRATION_ARGS="${INTEGRATION_ARGS:-tests/integration/sync-model.test.ts tests/integration/sync-routes.test.ts tests/integration/route-fuzz.test.ts tests/integration/sync-push.test.ts tests/integration/push-contention.test.ts tests/integration/notifications.test.ts tests/integration/dispatcher-reconnect.test.ts tests/integration/least-privilege.test.ts tests/integration/evidence-immutable.test.ts tests/integration/sessions.test.ts}" \
  bash scripts/test.sh
