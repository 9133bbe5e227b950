#!/usr/bin/env bash
# Installs what the two commands need and a fresh machine may lack. Idempotent and quiet when all
# is present. Usage: scripts/ensure-system.sh [postgresql] [chromium] [ngspice]
set -euo pipefail
cd "$(dirname "$0")/.."

need_apt=()
for want in "$@"; do
  case "$want" in
    postgresql) ls /usr/lib/postgresql/*/bin/pg_ctl >/dev/null 2>&1 || need_apt+=(postgresql) ;;
    chromium) [ -x /usr/bin/chromium ] || need_apt+=(chromium) ;;
    ngspice) command -v ngspice >/dev/null 2>&1 || need_apt+=(ngspice) ;;
    *) echo "ensure-system: unknown item '$want'" >&2; exit 2 ;;
  esac
done

if [ ${#need_apt[@]} -gt 0 ]; then
  echo "Installing Debian packages: ${need_apt[*]}"
  SUDO=""
  [ "$(id -u)" -eq 0 ] || SUDO="sudo"
  export DEBIAN_FRONTEND=noninteractive
  if ! $SUDO apt-get install -y -q "${need_apt[@]}" >/dev/null 2>&1; then
    $SUDO apt-get update -q >/dev/null
    $SUDO apt-get install -y -q "${need_apt[@]}" >/dev/null
  fi
fi

# node_modules: install when missing or when package-lock.json changed since the last install.
stamp=node_modules/.shelfmatch-lock.sha256
want_hash=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want_hash" ]; then
  echo "Installing npm packages (npm ci)..."
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want_hash" > "$stamp"
fi
