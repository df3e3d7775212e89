#!/usr/bin/env bash
# Entry point of `npm start` and `npm test`: makes sure the npm dependencies are
# installed (a fresh clone has none), then runs the given TypeScript script.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ ! -x node_modules/.bin/tsx ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "» Installing npm dependencies (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
fi
exec node --import tsx "$@"
