#!/usr/bin/env bash
# npm start: everything a fresh clone needs, then the app at http://127.0.0.1:3000.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib/common.sh
# A local .env (optional; see .env.example) overrides the defaults.
if [[ -f .env ]]; then set -a; source .env; set +a; fi

bash scripts/install-packages.sh
bash scripts/system-deps.sh postgres

started_services=0
if ! bash scripts/services.sh status >/dev/null 2>&1; then started_services=1; fi
bash scripts/services.sh up
stop_started() {
  # Ctrl-C stops what this command started, and nothing that was running before it.
  if [[ $started_services == 1 ]]; then bash scripts/services.sh down --quiet || true; fi
}
trap stop_started EXIT

export DATABASE_URL="${DATABASE_URL:-$RUNPROOF_DATABASE_URL}"
export APP_URL="${APP_URL:-http://127.0.0.1:${PORT:-3000}}"
# Production refuses the public development secret: make a random one on first run and keep it.
if [[ -z "${AUTH_SECRET:-}" ]]; then AUTH_SECRET="$(rp_ensure_auth_secret)"; fi
export AUTH_SECRET
node_modules/.bin/tsx database/migrate.ts
node_modules/.bin/tsx database/seed.ts
node_modules/.bin/react-router build >/dev/null

node_modules/.bin/tsx scripts/print-welcome.ts
# The web server and one job worker (round checks, mail, reminders, digests); more workers can
# be started beside them with `npm run worker`. A larger young generation (64 MB semi-spaces) lets
# the short-lived objects of each request die without a collection (docs/performance.md).
PORT="${PORT:-3000}" HOST="${HOST:-127.0.0.1}" NODE_ENV=production node --max-semi-space-size=64 scripts/serve.mjs &
server=$!
NODE_ENV=production node --max-old-space-size=768 --import tsx scripts/worker.ts &
worker=$!
# A background job of a script ignores Ctrl-C, so the script passes INT and TERM on as one TERM
# to each; when either process ends, the other is stopped too.
stop_both() { kill -TERM "$server" "$worker" 2>/dev/null || true; }
trap stop_both INT TERM
while kill -0 "$server" 2>/dev/null && kill -0 "$worker" 2>/dev/null; do wait -n "$server" "$worker" || true; done
stop_both
wait "$server" 2>/dev/null || true
wait "$worker" 2>/dev/null || true
