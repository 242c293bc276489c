// The bundled server (scripts/build-server.sh, what npm start runs) loads its rarely used heavy
// packages on first use, not at start: each is heap (and, for sharp, libvips) the server would
// hold for good (README, issue 13's memory row). Checked against esbuild's own account of the
// bundle's imports (its metafile: `import-statement` runs at start, `dynamic-import` when reached).
import { build } from 'esbuild';
import { describe, expect, it } from 'vitest';

async function serverImports(): Promise<Map<string, Set<string>>> {
  // The options of scripts/build-server.sh, without writing .build/ (a bench may be using it).
  const result = await build({
    entryPoints: ['server/index.ts'],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'esm',
    packages: 'external',
    outfile: 'server.mjs',
    write: false,
    metafile: true,
    logLevel: 'silent',
  });
  const kinds = new Map<string, Set<string>>();
  for (const output of Object.values(result.metafile.outputs)) {
    for (const { path, kind } of output.imports) {
      kinds.set(path, (kinds.get(path) ?? new Set()).add(kind));
    }
  }
  return kinds;
}

describe('the bundled server', () => {
  it('loads pdfkit, sharp, mailparser and smtp-server only when first used', async () => {
    const kinds = await serverImports();
    // A package the server needs from the start, so the check reads the right thing.
    expect(kinds.get('pg')).toEqual(new Set(['import-statement']));
    expect(kinds.get('express')).toEqual(new Set(['import-statement']));
    for (const name of ['pdfkit', 'sharp', 'mailparser', 'smtp-server']) {
      expect({ name, kinds: kinds.get(name) }).toEqual({
        name,
        kinds: new Set(['dynamic-import']),
      });
    }
  }, 60_000);
});
