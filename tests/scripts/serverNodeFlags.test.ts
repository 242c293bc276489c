/**
 * The server's Node flags: one file that npm start and the bench both read. Checked against
 * Node itself: the flags must be ones node accepts, and the heap limit must be the one set
 * (v8.getHeapStatistics().heap_size_limit counts the old generation plus the young one, so it
 * lies a little above the old generation's 512 MB).
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';

import { describe, expect, it } from 'vitest';

import { serverNodeFlags } from '@/scripts/bench/processes';

describe('the server Node flags file', () => {
  it('holds flags node accepts, and they set the old generation limit to 512 MB', () => {
    const flags = serverNodeFlags();
    expect(flags).toContain('--max-old-space-size=512');
    const limitBytes = Number(
      execFileSync(process.execPath, [
        ...flags,
        '-e',
        'console.log(require("node:v8").getHeapStatistics().heap_size_limit)',
      ]).toString(),
    );
    const limitMb = limitBytes / 2 ** 20;
    expect(limitMb).toBeGreaterThanOrEqual(512);
    // The young generation adds tens of MB, never hundreds: the default limit here is ~2 GB+.
    expect(limitMb).toBeLessThan(640);
  });

  it('is the file npm start reads, so the bench and npm start run the same server', () => {
    const start = fs.readFileSync('scripts/start.sh', 'utf8');
    expect(start).toMatch(/scripts\/server-node-flags/);
    expect(start).toMatch(/"\$\{server_flags\[@\]\}" \.build\/server\.mjs/);
  });

  it('skips comments and blank lines', () => {
    const dir = fs.mkdtempSync('/tmp/drybench-flags-');
    const file = `${dir}/flags`;
    fs.writeFileSync(file, '# why\n\n  --stack-size=900  \n# more\n--no-warnings\n');
    expect(serverNodeFlags(file)).toEqual(['--stack-size=900', '--no-warnings']);
    fs.rmSync(dir, { recursive: true });
  });
});
