// The local S3 fake for `npm start`: s3rver on loopback, its objects under the git-ignored
// .data/, the photo bucket made at start. A deployment sets S3_* to real object storage and
// does not run this.
//   tsx scripts/s3-fake.ts [--port 54325] [--dir .data/s3-dev] [--bucket drybench-photos]
import fs from 'node:fs';
import { parseArgs } from 'node:util';

import S3rver from 's3rver';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '54325' },
    dir: { type: 'string', default: '.data/s3-dev' },
    bucket: { type: 'string', default: 'drybench-photos' },
  },
});

async function main() {
  fs.mkdirSync(values.dir, { recursive: true });
  const server = new S3rver({
    // Loopback only: s3rver takes any request signed with its well-known key.
    address: '127.0.0.1',
    port: Number(values.port),
    silent: true,
    directory: values.dir,
    vhostBuckets: false,
    configureBuckets: [{ name: values.bucket, configs: [] }],
  });
  const address = await server.run();
  console.log(
    `S3 fake on http://127.0.0.1:${address.port} (bucket ${values.bucket}, data in ${values.dir})`,
  );
  const stop = () => {
    server.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

// tsx runs scripts as CommonJS here: no top-level await.
main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
