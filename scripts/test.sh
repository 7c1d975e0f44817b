#!/usr/bin/env bash
# npm test: the same set-up as npm start on a test database recreated for this run, then unit,
# integration and browser tests. Every stage runs; the exit status is non-zero if any failed.
set -uo pipefail
cd "$(dirname "$0")/.."
source scripts/setup.sh

export NODE_ENV=test
export DB_NAME="${TEST_DB_NAME:-yawpoint_test}"
export SMTP_PORT="${TEST_SMTP_PORT:-2526}"
export MAIL_FAKE_HTTP_PORT="${TEST_MAIL_HTTP_PORT:-2581}"
export PORT="${TEST_PORT:-3100}"
export NEXTAUTH_URL="http://127.0.0.1:$PORT"
export NEXTAUTH_SECRET="test-secret-$(date +%s)-not-for-production"
# One set of keys for the seed, the integration tests and the server of this run.
export AUDIT_KEY="test-audit-key-$(date +%s)-not-for-production"
export PARTICIPANT_DATA_KEY="test-data-key-$(date +%s)-not-for-production"
mkdir -p reports && rm -f reports/*.json

set -e
ensure_node_modules
ensure_chromium
npx tsx scripts/db.ts up --fresh
npx tsx scripts/mail-fake.ts --daemon
npx tsx scripts/seed.ts --quiet
set +e

status=0
npx tsc --noEmit -p . && echo "typecheck: ok" || status=1
npx vitest run --reporter=default --reporter=json --outputFile=reports/vitest.json || status=1
export NEXT_PUBLIC_YAWPOINT_TEST_SOURCES=1 # the simulated participant source, for the session browser tests only (npm start never sets it)
NODE_ENV=production npx next build || status=1
if [ -f .next/BUILD_ID ]; then
  npx playwright test || status=1
fi
node scripts/test-summary.mjs || status=1
exit $status
