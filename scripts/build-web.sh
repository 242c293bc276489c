#!/usr/bin/env bash
# Exports the web app to dist/ when its sources changed since the last export.
set -euo pipefail
cd "$(dirname "$0")/.."
sources=(app components ingest scripts/web app.json package-lock.json tsconfig.json)
[ -f metro.config.js ] && sources+=(metro.config.js)
hash=$(find "${sources[@]}" -type f -print0 | LC_ALL=C sort -z | xargs -0 sha256sum | sha256sum | cut -d' ' -f1)
if [ -f dist/index.html ] && [ "$(cat dist/.source-hash 2>/dev/null)" = "$hash" ]; then
  exit 0
fi
mkdir -p .tmp
echo "Building the web app (expo export)…"
start=$(date +%s)
# The page template: single output ignores app/+html.tsx and reads index.html from the public
# folder, which lives in scripts/web/ because the top level holds only the project's folders.
CI=1 EXPO_PUBLIC_FOLDER=scripts/web npx expo export --platform web --output-dir dist >.tmp/expo-export.log 2>&1 || {
  cat .tmp/expo-export.log
  exit 1
}
rm -f .tmp/expo-export.log
echo "$hash" > dist/.source-hash
echo "Web app built in $(($(date +%s) - start)) s."
