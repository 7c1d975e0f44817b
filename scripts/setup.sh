# Shared set-up for `npm start` and `npm test` (sourced, not run).
# Installs what a fresh machine lacks: npm dependencies, MariaDB (through scripts/db.ts), Chromium.

ensure_node_modules() {
  # Reinstall when node_modules is missing or older than the lock file.
  if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "setup: installing npm dependencies (npm ci)"
    npm ci --no-audit --no-fund
  fi
}

ensure_chromium() {
  if [ -x /usr/bin/chromium ]; then return 0; fi
  if [ "$(id -u)" != "0" ]; then
    echo "setup: Chromium is missing. Install it once with: sudo apt-get update && sudo apt-get install -y chromium" >&2
    return 1
  fi
  echo "setup: installing Debian's chromium with apt-get (once per machine)"
  DEBIAN_FRONTEND=noninteractive apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium
}

ensure_secret() {
  # Per-checkout random secrets for local runs (the session secret, the participant data key and the
  # audit chain's key, all outside the database); set them yourself anywhere else.
  mkdir -p .data
  if [ -z "${NEXTAUTH_SECRET:-}" ]; then
    [ -s .data/secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))' > .data/secret
    NEXTAUTH_SECRET="$(cat .data/secret)"
    export NEXTAUTH_SECRET
  fi
  if [ -z "${AUDIT_KEY:-}" ]; then
    [ -s .data/audit-key ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))' > .data/audit-key
    AUDIT_KEY="$(cat .data/audit-key)"
    export AUDIT_KEY
  fi
  if [ -z "${PARTICIPANT_DATA_KEY:-}" ]; then
    [ -s .data/data-key ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("base64url"))' > .data/data-key
    PARTICIPANT_DATA_KEY="$(cat .data/data-key)"
    export PARTICIPANT_DATA_KEY
  fi
}
