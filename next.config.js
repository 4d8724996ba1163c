// @ts-check
/**
 * Next.js configuration.
 * - Knex, mysql2, the AWS S3 SDK and the other server libraries below stay plain Node requires on the
 *   server (Turbopack must not bundle them); pdfkit finds its own data files (font metrics, colour
 *   profile) next to its code through a require made from its __filename.
 * - Security headers on every response: a content security policy that still lets the app (and its
 *   3D bench's Web Workers and canvas) work, no framing, no MIME sniffing.
 * - Attached photos are shown with <img src="/api/.../attachments/ID">, which redirects to a signed
 *   URL of the file store; img-src must allow the store's origin, read here at build time.
 */
const isDev = process.env.NODE_ENV !== 'production';

/** The dev S3 stand-in (scripts/lib/instance.mjs), also the default of src/lib/env.ts. */
const DEFAULT_S3_ENDPOINT = 'http://127.0.0.1:4569';

/**
 * Origins browsers fetch attachments from: S3_PUBLIC_URL when the store is published under another
 * address than the server uses, else S3_ENDPOINT. With virtual-hosted addressing
 * (S3_FORCE_PATH_STYLE=false) signed URLs name the bucket in the host, so that origin is added.
 */
function fileStoreOrigins() {
  const raw = process.env.S3_PUBLIC_URL || process.env.S3_ENDPOINT || DEFAULT_S3_ENDPOINT;
  let url;
  try {
    url = new URL(raw);
  } catch {
    throw new Error(`S3_PUBLIC_URL / S3_ENDPOINT is not a URL: "${raw}"`);
  }
  const origins = [url.origin];
  const bucket = process.env.S3_BUCKET;
  if (process.env.S3_FORCE_PATH_STYLE === 'false' && bucket) origins.push(`${url.protocol}//${bucket}.${url.host}`);
  return origins.join(' ');
}

const contentSecurityPolicy = [
  "default-src 'self'",
  // Next.js injects small inline bootstrap scripts; dev mode's React refresh needs eval.
  `script-src 'self' 'unsafe-inline'${isDev ? " 'unsafe-eval'" : ''}`,
  "style-src 'self' 'unsafe-inline'",
  `img-src 'self' data: blob: ${fileStoreOrigins()}`,
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

const securityHeaders = [
  { key: 'Content-Security-Policy', value: contentSecurityPolicy },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'same-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=()' },
  { key: 'Cross-Origin-Opener-Policy', value: 'same-origin' },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // npm start and npm test build into separate folders so both can run at once.
  distDir: process.env.COUPLET_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
  serverExternalPackages: ['knex', 'mysql2', 'nodemailer', 'rate-limiter-flexible', 'bcryptjs', '@aws-sdk/client-s3', '@aws-sdk/s3-request-presigner', 'pdfkit'],
  async headers() {
    return [{ source: '/:path*', headers: securityHeaders }];
  },
};

module.exports = nextConfig;
