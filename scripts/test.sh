#!/usr/bin/env bash
# npm test: install what is missing, then run every suite on a throw-away database (scripts/test.ts).
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/ensure-system.sh postgresql chromium ngspice
exec node_modules/.bin/tsx scripts/test.ts "$@"
