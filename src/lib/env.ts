import 'server-only';
import { z } from 'zod';
import { DEFAULT_DATABASE_URL } from './db-config';

/**
 * Server environment, parsed once with zod. `npm start` / `npm test` set every variable for the
 * local stand-ins; pointing a variable elsewhere (a real SMTP relay, a managed MariaDB) is all it
 * takes to use a real service.
 */
const envSchema = z.object({
  DATABASE_URL: z.string().url().default(DEFAULT_DATABASE_URL),
  APP_URL: z.string().url().default('http://127.0.0.1:3000'),
  NEXTAUTH_SECRET: z.string().min(16).optional(),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
  SMTP_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((value) => value === 'true'),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Couplet <no-reply@couplet.test>'),
  /** Hours an invitation link stays valid. */
  INVITATION_TTL_HOURS: z.coerce.number().positive().max(24 * 30).default(72),
  // Object storage for attachments: any S3-compatible service; the defaults are the dev stand-in
  // (scripts/s3-server.mjs, s3rver's fixed credentials).
  S3_ENDPOINT: z.string().url().default('http://127.0.0.1:4569'),
  /** The store's address as browsers reach it, when it differs from S3_ENDPOINT; signed URLs use it. */
  S3_PUBLIC_URL: z.preprocess((value) => (value === '' ? undefined : value), z.string().url().optional()),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).max(63).default('couplet'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  /** true: http://host/bucket/key (the stand-in, MinIO); false: http://bucket.host/key (AWS default). */
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false'])
    .default('true')
    .transform((value) => value === 'true'),
});

export type ServerEnv = z.infer<typeof envSchema>;

let cached: ServerEnv | undefined;

export function serverEnv(): ServerEnv {
  if (!cached) {
    const parsed = envSchema.safeParse(process.env);
    if (!parsed.success) {
      const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
      throw new Error(`Invalid environment: ${problems}`);
    }
    cached = parsed.data;
  }
  return cached;
}
