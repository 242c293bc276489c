#!/usr/bin/env bash
# npm test: installs what the tests need, starts a separate test PostgreSQL, builds the web
# app, then type-checks, lints, checks formatting and runs unit, API and browser tests.
set -euo pipefail
cd "$(dirname "$0")/.."
PG_PORT=${TEST_PG_PORT:-54330}

bash scripts/ensure-deps.sh

if [ ! -x /usr/bin/chromium ]; then
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
    echo "Installing Debian's chromium for the browser tests…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  else
    echo "Browser tests need Debian's chromium. Run: sudo apt-get install -y chromium" >&2
    exit 1
  fi
fi

# A fresh database every run, so no test depends on what an earlier run left.
bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
# Stop the test server afterwards only if this run started it (a developer may keep it up).
if [ -n "$bin" ] && "$bin/pg_isready" -q -h 127.0.0.1 -p "$PG_PORT"; then
  url=$(bash scripts/db.sh start test "$PG_PORT" postgres)
else
  url=$(bash scripts/db.sh start test "$PG_PORT" postgres)
  trap 'bash scripts/db.sh stop test' EXIT
fi
bin=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)
"$bin/psql" -q "$url" -c 'drop database if exists drybench_test with (force)' -c 'create database drybench_test'
export DATABASE_URL=${url%/postgres}/drybench_test

bash scripts/build-web.sh

echo "Type-checking…" && npx tsc --noEmit -p .
echo "Linting…" && npx eslint . --max-warnings 0
echo "Checking format…" && npx prettier --check . >/dev/null || {
  npx prettier --list-different .
  echo "Run: npx prettier --write ." >&2
  exit 1
}
npx vitest run "$@"
