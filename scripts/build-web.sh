#!/usr/bin/env bash
# Exports the web app to dist/ when its sources changed since the last export.
set -euo pipefail
cd "$(dirname "$0")/.."
sources=(app components ingest scripts/web app.json package-lock.json tsconfig.json)
[ -f metro.config.js ] && sources+=(metro.config.js)
hash=$( (find "${sources[@]}" -type f -print0 | LC_ALL=C sort -z | xargs -0 sha256sum; echo "shake=${EXPO_TREE_SHAKING:-1}") | sha256sum | cut -d' ' -f1)
if [ -f dist/index.html ] && [ "$(cat dist/.source-hash 2>/dev/null)" = "$hash" ]; then
  exit 0
fi
mkdir -p .tmp
echo "Building the web app (expo export)…"
start=$(date +%s)
# The page template: single output ignores app/+html.tsx and reads index.html from the public
# folder, which lives in scripts/web/ because the top level holds only the project's folders.
# Tree shaking drops the unused exports of barrels (ingest/words, components/forms …) and of
# libraries imported whole: it halves the shared chunk every page loads (DEVELOPERS.md, "Web
# bundle"). It is marked unstable in SDK 56 and makes the export slower; EXPO_TREE_SHAKING=0
# turns it off to compare. scripts/bundle-report.ts exports with the same settings.
shake=${EXPO_TREE_SHAKING:-1}
CI=1 EXPO_PUBLIC_FOLDER=scripts/web EXPO_UNSTABLE_TREE_SHAKING=$shake EXPO_UNSTABLE_METRO_OPTIMIZE_GRAPH=$shake \
  npx expo export --platform web --output-dir dist >.tmp/expo-export.log 2>&1 || {
  cat .tmp/expo-export.log
  exit 1
}
rm -f .tmp/expo-export.log
echo "$hash" > dist/.source-hash
echo "Web app built in $(($(date +%s) - start)) s."
