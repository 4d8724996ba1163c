#!/usr/bin/env node
// Local S3 stand-in for development and tests: s3rver (an S3-compatible server that keeps objects
// as files) on loopback, with the app's bucket created at start. The app talks to it through the
// AWS SDK like to any S3 service, so a real bucket is just different S3_* settings.
//
//   node scripts/s3-server.mjs --port 4569 --dir .data/dev/s3 --bucket couplet [--host 127.0.0.1]
//
// Credentials are s3rver's fixed pair S3RVER / S3RVER. Path-style addressing only
// (http://127.0.0.1:4569/couplet/<key>). The stand-in does not check V4 signatures (it does check
// that a pre-signed URL has not expired) and serves unsigned reads: keep it on loopback.
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import S3rver from 's3rver';

const { values: opts } = parseArgs({
  options: {
    port: { type: 'string', default: '4569' },
    dir: { type: 'string', default: '.data/dev/s3' },
    bucket: { type: 'string', default: 'couplet' },
    host: { type: 'string', default: '127.0.0.1' },
  },
});
const HOST = opts.host;
const PORT = Number(opts.port);
const DIR = path.resolve(opts.dir);
fs.mkdirSync(DIR, { recursive: true });

const log = (msg) => console.log(`${new Date().toISOString()} ${msg}`);

const server = new S3rver({
  address: HOST,
  port: PORT,
  directory: DIR,
  // s3rver's own logger writes coloured debug lines; one plain line per request is logged below.
  silent: true,
  // Path-style only: a Host header that merely ends in the service endpoint must not pick a bucket.
  vhostBuckets: false,
  configureBuckets: [{ name: opts.bucket }],
});

let stopping = false;
try {
  await server.run();
} catch (err) {
  console.error(`cannot listen for S3 on ${HOST}:${PORT}: ${err.message}`);
  process.exit(1);
}
// Method, path (without the query: it holds signatures), status and time of every request.
server.httpServer.on('request', (req, res) => {
  const started = Date.now();
  res.on('finish', () => log(`${req.method} ${req.url.split('?')[0]} ${res.statusCode} ${Date.now() - started}ms`));
});
log(`S3 stand-in ready: http://${HOST}:${PORT}, bucket "${opts.bucket}", objects in ${DIR}`);

for (const sig of ['SIGTERM', 'SIGINT', 'SIGHUP']) {
  process.on(sig, () => {
    if (stopping) return;
    stopping = true;
    log(`${sig}: stopping`);
    server.httpServer?.closeAllConnections?.();
    server.close().then(
      () => process.exit(0),
      () => process.exit(0),
    );
    setTimeout(() => process.exit(0), 3000).unref();
  });
}
