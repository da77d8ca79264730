#!/usr/bin/env bash
# npm test: the same set-up as npm start against the test database, then every test.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib/common.sh
t0=$(date +%s)
step() { printf '\n== %s (%ss)\n' "$1" "$(($(date +%s) - t0))"; }

step "packages"
bash scripts/install-packages.sh
bash scripts/system-deps.sh postgres chromium

step "services"
started_services=0
if ! bash scripts/services.sh status >/dev/null 2>&1; then started_services=1; fi
bash scripts/services.sh up
trap '[[ $started_services == 1 ]] && bash scripts/services.sh down --quiet || true' EXIT

export DATABASE_URL="$RUNPROOF_TEST_DATABASE_URL"
export NODE_ENV=test
step "test database: reset, migrate, seed"
node_modules/.bin/tsx database/reset.ts
node_modules/.bin/tsx database/migrate.ts
node_modules/.bin/tsx database/seed.ts

step "typecheck"
npm run --silent typecheck

step "unit and integration tests (vitest)"
node_modules/.bin/vitest run

step "production build"
NODE_ENV=production node_modules/.bin/react-router build >/dev/null

step "end-to-end tests (playwright, Debian's chromium)"
node_modules/.bin/playwright test

step "done"
