#!/usr/bin/env bash
# npm start: from a fresh clone, installs what is missing, starts MariaDB and the mail fake,
# migrates, seeds the demo, builds and serves on http://localhost:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/setup.sh

export PORT="${PORT:-3000}"
export NEXTAUTH_URL="${NEXTAUTH_URL:-http://localhost:$PORT}"
ensure_node_modules
ensure_secret
# Without a mail server of your own (SMTP_HOST), the demo's mail goes to the local fake, where the
# admin reads it; with one, nothing is kept locally (MAIL_FAKE defaults to false outside development).
if [ -z "${SMTP_HOST:-}" ]; then export MAIL_FAKE="${MAIL_FAKE:-true}"; fi
npx tsx scripts/db.ts up
npx tsx scripts/mail-fake.ts --daemon
npx tsx scripts/seed.ts --quiet
NODE_ENV=production npx next build
npx tsx scripts/seed.ts | sed -n '/Demo sign-ins/,$p'
echo
echo "Yawpoint: http://localhost:$PORT  (mail sent in development: sign in as the admin, then Mail)"
echo "Stop: Ctrl-C, then npm run db:stop to stop MariaDB."
exec npx tsx scripts/serve.ts -H 127.0.0.1 -p "$PORT"
