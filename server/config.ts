import os from 'node:os';
import { z } from 'zod';

/**
 * App processes under `npm start` (HEADROOM_PROCESSES): one per core by default — Node runs a
 * process's JavaScript on one thread, so a core each is what the machine can use (common practice) —
 * and at most 8: beyond that one PostgreSQL primary's connections (8 × the pool's 10 = 80 of the
 * local cluster's 200) and its own cores, not the app, set the pace (a choice).
 */
export const MAX_PROCESSES = 8;
const defaultProcesses = () => Math.max(1, Math.min(os.availableParallelism(), MAX_PROCESSES));

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
  /**
   * The content security policy's upgrade-insecure-requests: browsers then fetch every script and
   * call over https. Right only when the app is reached over TLS; served over plain http on any
   * host but localhost it leaves a blank page (issue 13 finding 4). auto: on when COOKIE_SECURE=1
   * or PUBLIC_URL is https; 1 / 0: always / never.
   */
  CSP_UPGRADE_INSECURE: z.enum(['auto', '0', '1']).default('auto'),
  /** app processes sharing the port (node:cluster); see MAX_PROCESSES */
  HEADROOM_PROCESSES: z.coerce.number().int().min(1).max(MAX_PROCESSES).default(defaultProcesses),
  /**
   * where the sign-in and link limits count: memory (one process) or postgres (shared by every
   * process and machine over the one database). auto: postgres when the server runs several
   * processes (HEADROOM_PROCESSES > 1), else memory. Set postgres when several machines serve one
   * database: counted in memory, each would allow the limit again.
   */
  RATE_LIMIT_STORE: z.enum(['auto', 'memory', 'postgres']).default('auto'),
  /** sign-in attempts per 15 minutes per address and e-mail */
  SIGN_IN_LIMIT: z.coerce.number().int().min(1).default(10),
  /**
   * failed sign-ins per 15 minutes from one client address, whatever the e-mail (password
   * spraying across accounts). 50: an office behind one address with a few people mistyping stays
   * under it; one address trying a password on many accounts does not (a choice).
   */
  SIGN_IN_CLIENT_LIMIT: z.coerce.number().int().min(1).default(50),
  /**
   * uses of a one-time link (choosing a password through a reset or an invitation link) per 15
   * minutes per client address: each can cost a password hash. 10 is several tries for a person (a choice).
   */
  LINK_LIMIT: z.coerce.number().int().min(1).default(10),
  /** minutes of inactivity before a session ends (8 h: a working day, common practice) */
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(480),
  /** hours an invitation link stays valid */
  INVITATION_HOURS: z.coerce.number().int().min(1).default(72),
  /**
   * minutes a "forgot my password" link stays valid. 60: long enough for the mail to arrive and be
   * read, short enough that a link left in a mailbox soon stops working (a choice; the OWASP Forgot
   * Password Cheat Sheet asks for a short-lived, single-use token without fixing the period).
   * Unlike an invitation (72 h), anyone who types the address can ask for one.
   */
  RESET_TOKEN_MINUTES: z.coerce.number().int().min(1).default(60),
  /** largest field-change attachment, bytes (10 MiB: a scanned data sheet or a phone photo fits; a choice) */
  UPLOAD_MAX_BYTES: z.coerce
    .number()
    .int()
    .min(1024)
    .default(10 * 1024 * 1024),

  // ---- e-mail (server/mail): SMTP relay, sender, the outbox worker's pace
  SMTP_HOST: z.string().default('127.0.0.1'),
  /** 587: the message submission port (RFC 6409) */
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(587),
  /** 1: TLS from the first byte (port 465, RFC 8314); 0: plain, upgraded by STARTTLS when offered */
  SMTP_SECURE: z.enum(['0', '1']).default('0'),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Headroom <headroom@localhost>'),
  /**
   * 1: run the local SMTP sink in-process and send all mail to it instead of the relay (development
   * and tests only: refused with NODE_ENV=production). Off unless set.
   */
  HEADROOM_DEV_MAIL: z.enum(['0', '1']).default('0'),
  /**
   * 1 (with HEADROOM_DEV_MAIL=1): administrators may list the caught mail at /api/dev/mail. Even
   * then a message is shown whole only to its own recipient; to anyone else its text (one-time
   * links included) and attachments are withheld (issue 13 finding 5).
   */
  HEADROOM_DEV_MAIL_PAGE: z.enum(['0', '1']).default('0'),
  /** port of the local SMTP sink; 0 picks a free one */
  DEV_MAIL_PORT: z.coerce.number().int().min(0).max(65535).default(0),
  /** how often the outbox worker looks for due messages (a choice: mail within seconds, light on the database) */
  OUTBOX_POLL_MS: z.coerce.number().int().min(10).default(2000),
  /** first retry delay; each further attempt doubles it (30 s, 1 min, 2 min, … a choice) */
  OUTBOX_RETRY_BASE_MS: z.coerce.number().int().min(1).default(30_000),
  /** the longest delay between two attempts (1 h, a choice) */
  OUTBOX_RETRY_MAX_MS: z.coerce.number().int().min(1).default(3_600_000),
  /** attempts before a message is marked failed: 8 spans about 1 h of outage at the defaults (a choice) */
  OUTBOX_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(8),
  /** how long a claimed message is reserved for its worker; longer than the SMTP timeouts (server/mail/transport.ts) added up */
  OUTBOX_LEASE_SECONDS: z.coerce.number().int().min(1).default(120),
});

const CheckedConfigSchema = ConfigSchema.superRefine((c, ctx) => {
  if (c.NODE_ENV === 'production' && c.HEADROOM_DEV_MAIL === '1') {
    ctx.addIssue({
      code: 'custom',
      path: ['HEADROOM_DEV_MAIL'],
      message: 'the development mail sink never runs with NODE_ENV=production; set SMTP_HOST (and SMTP_USER/SMTP_PASS) to a real relay',
    });
  }
});

export type Config = z.infer<typeof ConfigSchema>;

/** Whether the CSP asks browsers to upgrade requests to https (see CSP_UPGRADE_INSECURE). */
export function upgradesInsecureRequests(config: Config): boolean {
  if (config.CSP_UPGRADE_INSECURE !== 'auto') return config.CSP_UPGRADE_INSECURE === '1';
  return config.COOKIE_SECURE === '1' || config.PUBLIC_URL.startsWith('https:');
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = CheckedConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Headroom cannot start; fix these settings:\n${lines.join('\n')}`);
  }
  return parsed.data;
}
