#!/usr/bin/env bash
# npm start: install what is missing, then run the product (scripts/start.ts does the rest).
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -z "${DATABASE_URL:-}" ]; then
  scripts/ensure-system.sh postgresql
else
  scripts/ensure-system.sh
fi
exec node_modules/.bin/tsx scripts/start.ts
