import { z } from 'zod';

/** Every setting the server reads, validated once at start (a bad value stops it with a clear message). */
const ConfigSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(5480),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().url('DATABASE_URL must be a postgres:// URL'),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must have at least 32 characters'),
  PUBLIC_URL: z.string().url().default('http://127.0.0.1:5480'),
  /** set to 1 behind a TLS-terminating proxy: cookies become Secure and the proxy is trusted */
  COOKIE_SECURE: z.enum(['0', '1']).default('0'),
  HEADROOM_SERVE_CLIENT: z.enum(['0', '1']).default('0'),
  /** sign-in attempts per 15 minutes per address and e-mail */
  SIGN_IN_LIMIT: z.coerce.number().int().min(1).default(10),
  /** minutes of inactivity before a session ends (8 h: a working day, common practice) */
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(480),
  /** hours an invitation link stays valid */
  INVITATION_HOURS: z.coerce.number().int().min(1).default(72),
});

export type Config = z.infer<typeof ConfigSchema>;

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Headroom cannot start; fix these settings:\n${lines.join('\n')}`);
  }
  return parsed.data;
}
