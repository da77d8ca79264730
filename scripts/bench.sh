#!/usr/bin/env bash
# npm run bench: services up, a production build, then scripts/bench.ts against its own database.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib/common.sh
started_services=0
if ! bash scripts/services.sh status >/dev/null 2>&1; then started_services=1; fi
bash scripts/services.sh up
trap '[[ $started_services == 1 ]] && bash scripts/services.sh down --quiet || true' EXIT
NODE_ENV=production node_modules/.bin/react-router build >/dev/null
node --import tsx scripts/bench.ts
