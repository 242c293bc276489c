#!/usr/bin/env bash
# Bundles the server into one ES module (.build/server.mjs; packages stay in node_modules) so
# `npm start` runs it on plain node: the tsx loader would cost ~40 MB of memory and start-up.
set -euo pipefail
cd "$(dirname "$0")/.."
npx esbuild server/index.ts --bundle --platform=node --target=node20 --format=esm \
  --packages=external --sourcemap --outfile=.build/server.mjs --log-level=warning
