// The local S3 stand-in: s3rver on loopback with a git-ignored data directory and the
// bucket created at start. Run with tsx; it stays in the foreground until SIGTERM.
import S3rver from 's3rver';
import { mkdirSync } from 'node:fs';

const port = Number(process.env.S3_PORT ?? 45690);
const directory = `${process.env.LOCAL_DIR ?? '.local/dev'}/s3`;
const bucket = process.env.S3_BUCKET ?? 'sigmaline-casts';
mkdirSync(directory, { recursive: true });

const server = new S3rver({
  address: '127.0.0.1',
  port,
  silent: true,
  directory,
  configureBuckets: [{ name: bucket, configs: [] }],
  allowMismatchedSignatures: true,
});
await server.run();
console.log(`[sigmaline] S3 fake on http://127.0.0.1:${port} bucket ${bucket}`);
const stop = () => {
  server.close().finally(() => process.exit(0));
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
