#!/usr/bin/env bash
# Installs the npm dependencies when node_modules is missing or older than package-lock.json.
set -euo pipefail
cd "$(dirname "$0")/.."
stamp=node_modules/.drybench-lock.sha256
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
  echo "Installing npm dependencies (npm ci)…"
  npm ci --no-audit --no-fund
  echo "$want" > "$stamp"
fi
