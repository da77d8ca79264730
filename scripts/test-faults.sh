#!/usr/bin/env bash
# npm run test:faults: the fault tests (faults/), against the production build, on a database of
# their own (runproof_faults_test). They stop and restart this checkout's maildev, s3rver and
# PostgreSQL, so they are not part of `npm test`; every service is started again at the end.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib/common.sh
bash scripts/services.sh up --quiet
trap 'bash scripts/services.sh up --quiet || true' EXIT
if [[ ! -f build/server/index.js || -n "${FAULTS_BUILD:-}" ]]; then
  NODE_ENV=production node_modules/.bin/react-router build >/dev/null
fi
DATABASE_URL="$(node_modules/.bin/tsx -e 'import("./scripts/lib/scratch-database.ts").then(async (m) => console.log(await m.scratchDatabase("faults", { seed: true })))' | tail -n1)"
export DATABASE_URL
node_modules/.bin/vitest run --config vitest.faults.config.ts "$@"
