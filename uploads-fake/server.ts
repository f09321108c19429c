/**
 * Local S3-compatible object storage for the demo and the tests (s3rver). Objects live under
 * uploads-fake/data/<profile>/ (git-ignored). The API talks to it with the real AWS S3 SDK.
 */
import path from 'node:path';
import fs from 'node:fs';
// s3rver ships no types.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const S3rver = require('s3rver') as new (opts: Record<string, unknown>) => {
  run(): Promise<unknown>;
  close(): Promise<void>;
};

const port = Number(process.env.S3_PORT ?? 4569);
const bucket = process.env.S3_BUCKET ?? 'yokeline';
const dir = process.env.S3_DATA_DIR ?? path.resolve(__dirname, '../../../uploads-fake/data/dev');
fs.mkdirSync(dir, { recursive: true });

const server = new S3rver({
  address: '127.0.0.1',
  port,
  silent: true,
  directory: dir,
  configureBuckets: [{ name: bucket }],
});

server
  .run()
  .then(() => console.log(`S3 fake on http://127.0.0.1:${port} (bucket ${bucket}, data in ${dir})`))
  .catch((err: unknown) => {
    console.error('S3 fake failed to start', err);
    process.exit(1);
  });

const stop = (): void => {
  void server.close().finally(() => process.exit(0));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
