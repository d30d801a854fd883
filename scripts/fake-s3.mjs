#!/usr/bin/env node
// A local S3-compatible server for development and tests (s3rver, from the npm registry): serves a folder on
// 127.0.0.1, creates the bucket, and prints one JSON line {endpoint, bucket} once it listens.
// Usage: node --openssl-legacy-provider scripts/fake-s3.mjs [--port N] [--dir FOLDER] [--bucket NAME]
// (s3rver makes the continuation tokens of long listings with a cipher that OpenSSL 3 keeps in its legacy provider.)
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '0' },
    dir: { type: 'string', default: path.resolve('storage/fake-s3') },
    bucket: { type: 'string', default: 'splitfield-dev' },
  },
});
mkdirSync(values.dir, { recursive: true });
const server = new S3rver({
  address: '127.0.0.1',
  port: Number(values.port),
  directory: values.dir,
  silent: true,
  configureBuckets: [{ name: values.bucket }],
});
const { address, port } = await server.run();
console.log(JSON.stringify({ endpoint: `http://${address}:${port}`, bucket: values.bucket }));
const stop = () => server.close().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
