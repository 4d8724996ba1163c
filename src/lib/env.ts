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
