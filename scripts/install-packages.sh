#!/usr/bin/env bash
# Installs the locked packages when node_modules is missing or older than the lockfile.
set -euo pipefail
cd "$(dirname "$0")/.."
if [[ ! -f node_modules/.package-lock.json || package-lock.json -nt node_modules/.package-lock.json ]]; then
  echo "installing packages (npm ci) …"
  npm ci --no-audit --no-fund --loglevel=error
fi
