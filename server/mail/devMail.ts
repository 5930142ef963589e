/** Reading the development sink's messages (HEADROOM_DEV_MAIL=1 only; mailparser is a dev dependency). */
import { createHash } from 'node:crypto';
import { notFound } from '../http/errors';
import type { ServiceContext } from '../services/context';
import type { DevMail } from '../../src/shared/api/summaries';

interface DevMailRow {
  id: string | number;
  envelope_from: string;
  envelope_to: string[];
  message_id: string | null;
  raw: Buffer;
  received_at: Date;
}

/** What a viewer who is not among a message's recipients sees instead of its text. */
export const WITHHELD_TEXT = '(Withheld: this message was sent to someone else. Only its recipient reads its text, links and attachments.)';

const isRecipient = (row: DevMailRow, viewerEmail: string) => row.envelope_to.some((to) => to.toLowerCase() === viewerEmail.toLowerCase());

async function parse(row: DevMailRow, viewerEmail: string) {
  const { simpleParser } = await import('mailparser');
  const parsed = await simpleParser(row.raw);
  const id = Number(row.id);
  const mail: DevMail = {
    id,
    receivedAt: row.received_at.toISOString(),
    envelopeFrom: row.envelope_from,
    envelopeTo: row.envelope_to,
    messageId: parsed.messageId ?? row.message_id,
    from: parsed.from?.text ?? '',
    to: (Array.isArray(parsed.to) ? parsed.to.map((t) => t.text).join(', ') : parsed.to?.text) ?? '',
    subject: parsed.subject ?? '',
    // one-time links (password reset, invitation) and summary PDFs are the recipient's alone (issue 13 finding 5)
    text: isRecipient(row, viewerEmail) ? (parsed.text ?? '') : WITHHELD_TEXT,
    attachments: (isRecipient(row, viewerEmail) ? parsed.attachments : []).map((a, index) => ({
      index,
      filename: a.filename ?? `attachment-${index}`,
      contentType: a.contentType,
      size: a.content.length,
      sha256: createHash('sha256').update(a.content).digest('hex'),
      url: `/api/dev/mail/${id}/attachments/${index}`,
    })),
  };
  return { mail, parsed };
}

export const devMailService = {
  /** the newest caught messages, optionally only those to one address */
  async list(ctx: ServiceContext, viewerEmail: string, q: { to?: string; limit: number }): Promise<DevMail[]> {
    const query = ctx.db('dev_mail').orderBy('id', 'desc').limit(q.limit);
    if (q.to) query.whereRaw('envelope_to @> ?::jsonb', [JSON.stringify([q.to])]);
    const rows = (await query) as DevMailRow[];
    return Promise.all(rows.map(async (r) => (await parse(r, viewerEmail)).mail));
  },
  async get(ctx: ServiceContext, viewerEmail: string, id: number): Promise<DevMail> {
    const row = (await ctx.db('dev_mail').where({ id }).first()) as DevMailRow | undefined;
    if (!row) throw notFound('The message');
    return (await parse(row, viewerEmail)).mail;
  },
  async attachment(ctx: ServiceContext, viewerEmail: string, id: number, index: number) {
    const row = (await ctx.db('dev_mail').where({ id }).first()) as DevMailRow | undefined;
    if (!row || !isRecipient(row, viewerEmail)) throw notFound('The message');
    const { parsed } = await parse(row, viewerEmail);
    const a = parsed.attachments[index];
    if (!a) throw notFound('The attachment');
    return { filename: a.filename ?? `attachment-${index}`, contentType: a.contentType, content: a.content };
  },
};
