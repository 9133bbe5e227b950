#!/usr/bin/env bash
# npm run bench: the performance report (never a test). Runs every bench/*-bench.ts in turn.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/ensure-system.sh postgresql
status=0
for f in bench/*-bench.ts; do
  [ -e "$f" ] || continue
  echo "=== $f ==="
  node_modules/.bin/tsx "$f" || { echo "bench $f failed"; status=1; }
done
exit $status
