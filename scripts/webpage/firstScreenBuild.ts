/**
 * Builds the server's renderer of the overview's first screen (server/firstScreen.ts) into an
 * export folder, from the same sources as the export: the app's components for Node, with
 * react-native as react-native-web (its .web files first, as Metro picks them) and expo-router
 * as the few pieces a server render needs (firstScreenRouter.tsx). One file with its packages
 * inside, so it carries its own React and never meets the server's modules.
 */
import path from 'node:path';

import { buildSync } from 'esbuild';

/** The renderer's place inside an export; server/firstScreen.ts reads the same path. */
export const RENDERER_PATH = path.join('_ssr', 'first-screen.cjs');

export function buildFirstScreenRenderer(webDir: string): string {
  const here = path.dirname(__filename);
  const outfile = path.join(webDir, RENDERER_PATH);
  buildSync({
    entryPoints: [path.join(here, 'firstScreenEntry.tsx')],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    jsx: 'automatic',
    alias: {
      'react-native': 'react-native-web',
      'expo-router': path.join(here, 'firstScreenRouter.tsx'),
    },
    resolveExtensions: ['.web.tsx', '.web.ts', '.web.js', '.tsx', '.ts', '.js', '.json'],
    mainFields: ['module', 'main'],
    // React's production build: the development one checks and warns on every render.
    define: { 'process.env.NODE_ENV': '"production"' },
    logLevel: 'warning',
    outfile,
  });
  return outfile;
}

if (require.main === module) {
  const dir = process.argv[2];
  if (!dir) throw new Error('usage: tsx scripts/webpage/firstScreenBuild.ts <export folder>');
  buildFirstScreenRenderer(dir);
}
