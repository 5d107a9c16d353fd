#!/usr/bin/env node
// Local stand-in for a hosted object store: an S3-compatible server (s3rver) on 127.0.0.1.
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

const arg = (name, dflt) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : dflt;
};
const port = Number(arg('port', 4569));
const dir = arg('dir', '.data/objects');
const bucket = arg('bucket', 'crankjournal');
mkdirSync(dir, { recursive: true });
const server = new S3rver({ port, address: '127.0.0.1', directory: dir, silent: true, configureBuckets: [{ name: bucket }] });
await server.run();
console.log(`object store: S3-compatible on http://127.0.0.1:${port} (bucket "${bucket}", files in ${dir})`);
const stop = () => server.close().finally(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
