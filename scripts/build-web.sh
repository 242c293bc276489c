#!/usr/bin/env bash
# Exports the web app to dist/ when its sources changed since the last export, then finishes the
# page (scripts/webpage/) when the export or the finishing step changed.
set -euo pipefail
cd "$(dirname "$0")/.."
hash_of() { (find "$@" -type f -print0 | LC_ALL=C sort -z | xargs -0 sha256sum; echo "shake=${EXPO_TREE_SHAKING:-1} inline=${EXPO_INLINE_REQUIRES:-1}") | sha256sum | cut -d' ' -f1; }
sources=(app components ingest scripts/web app.json package-lock.json tsconfig.json)
[ -f metro.config.js ] && sources+=(metro.config.js)
hash=$(hash_of "${sources[@]}")
if [ ! -f dist/index.html ] || [ "$(cat dist/.source-hash 2>/dev/null)" != "$hash" ]; then
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
  rm -f dist/.finish-hash
  CI=1 EXPO_PUBLIC_FOLDER=scripts/web EXPO_UNSTABLE_TREE_SHAKING=$shake EXPO_UNSTABLE_METRO_OPTIMIZE_GRAPH=$shake \
    npx expo export --platform web --output-dir dist >.tmp/expo-export.log 2>&1 || {
    cat .tmp/expo-export.log
    exit 1
  }
  rm -f .tmp/expo-export.log
  echo "$hash" > dist/.source-hash
  echo "Web app built in $(($(date +%s) - start)) s."
fi
# The page's boot script, font faces and preloads, and the compressed copies the server sends
# (scripts/webpage/finishExport.ts); a second run replaces what the first added.
finish=$(hash_of scripts/webpage dist/.source-hash)
if [ "$(cat dist/.finish-hash 2>/dev/null)" != "$finish" ]; then
  npx tsx scripts/webpage/finishExport.ts dist
  # The server's renderer of the overview's first screen (server/firstScreen.ts).
  npx tsx scripts/webpage/firstScreenBuild.ts dist
  echo "$finish" > dist/.finish-hash
fi
