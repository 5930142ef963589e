import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';

export interface OutgoingMail {
  messageId: string;
  to: { name: string; address: string };
  subject: string;
  text: string;
  headers?: Record<string, string>;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

/** Sends one message; resolves once the SMTP server accepted it (250 after DATA), else rejects. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<{ response: string }>;
  close(): void;
}

/**
 * Timeouts, ms: connecting 10 s, the greeting 10 s, a silent socket 30 s (choices: well above a
 * loopback or LAN relay, and together under the outbox lease, so a hung send ends before another
 * worker may take the message over).
 */
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

/**
 * The SMTP relay from the settings, or — with `target` — the local development sink (plain SMTP
 * on loopback, no authentication), whose port is known only once it listens.
 */
export function createMailer(config: Config, target?: Promise<{ host: string; port: number }>): Mailer {
  let transporter: Promise<Transporter> | null = null;
  const get = () =>
    (transporter ??= (async () => {
      if (target) {
        const { host, port } = await target;
        return nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true, ...TIMEOUTS });
      }
      return nodemailer.createTransport({
        host: config.SMTP_HOST,
        port: config.SMTP_PORT,
        secure: config.SMTP_SECURE === '1',
        ...(config.SMTP_USER ? { auth: { user: config.SMTP_USER, pass: config.SMTP_PASS ?? '' } } : {}),
        ...TIMEOUTS,
      });
    })());
  return {
    async send(mail) {
      const t = await get();
      const info = await t.sendMail({
        from: config.MAIL_FROM,
        to: { name: mail.to.name, address: mail.to.address },
        subject: mail.subject,
        text: mail.text,
        messageId: mail.messageId,
        headers: mail.headers,
        attachments: mail.attachments,
      });
      return { response: String(info.response ?? '') };
    },
    close() {
      void transporter?.then((t) => t.close()).catch(() => {});
    },
  };
}
