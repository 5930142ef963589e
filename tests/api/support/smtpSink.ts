/**
 * A local SMTP sink for the mail tests: smtp-server on 127.0.0.1 (port 0 = a free one), every
 * message kept raw and parsed with mailparser. It can refuse the next N messages with a
 * temporary error, and be stopped and started again on the same port (an outage).
 */
import { SMTPServer } from 'smtp-server';
import { simpleParser, type ParsedMail } from 'mailparser';
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Client, Harness } from './harness';
import { ATTESTATION } from './attestation';

export interface CaughtMail {
  raw: Buffer;
  envelope: { from: string; to: string[] };
  parsed: ParsedMail;
}

export class SmtpSink {
  readonly messages: CaughtMail[] = [];
  /** DATA replies 451 (temporary failure) to this many further messages */
  refuseNext = 0;
  /** per recipient address: refuse this many further messages to it */
  readonly refuseTo = new Map<string, number>();
  refused = 0;
  port = 0;
  private server: SMTPServer | null = null;

  async start(port = this.port): Promise<number> {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', async () => {
          const to = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
          const targeted = to.find((a) => (this.refuseTo.get(a) ?? 0) > 0);
          if (this.refuseNext > 0 || targeted) {
            if (targeted) this.refuseTo.set(targeted, this.refuseTo.get(targeted)! - 1);
            else this.refuseNext--;
            this.refused++;
            const err = new Error('Test sink: try again later') as Error & { responseCode: number };
            err.responseCode = 451;
            return callback(err);
          }
          const raw = Buffer.concat(chunks);
          this.messages.push({
            raw,
            envelope: { from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '', to: session.envelope.rcptTo.map((r) => r.address) },
            parsed: await simpleParser(raw),
          });
          callback();
        });
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => resolve());
    });
    const address = server.server.address();
    this.port = typeof address === 'object' && address ? address.port : port;
    this.server = server;
    return this.port;
  }

  async stop() {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  /** Waits until `count` messages arrived (or throws after `timeoutMs`). */
  async waitFor(count: number, timeoutMs = 15_000): Promise<CaughtMail[]> {
    const deadline = Date.now() + timeoutMs;
    while (this.messages.length < count) {
      if (Date.now() > deadline) throw new Error(`the sink got ${this.messages.length} of ${count} messages in ${timeoutMs} ms`);
      await new Promise((r) => setTimeout(r, 25));
    }
    return this.messages;
  }

  to(address: string) {
    return this.messages.filter((m) => m.envelope.to.includes(address.toLowerCase()));
  }
}

/** Outbox settings for tests: quick polls and retries (ms), so an outage of a second is a few attempts. */
export const FAST_OUTBOX = {
  OUTBOX_POLL_MS: '30',
  OUTBOX_RETRY_BASE_MS: '40',
  OUTBOX_RETRY_MAX_MS: '300',
  OUTBOX_MAX_ATTEMPTS: '6',
  OUTBOX_LEASE_SECONDS: '30',
} as const;

export function demoDocument(): Record<string, unknown> {
  const file = path.resolve(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url).pathname);
  return { ...JSON.parse(fs.readFileSync(file, 'utf8')), id: randomUUID() };
}

/** A system made from `document` and issued by the project's designer; returns the API paths. */
export async function issuedSystem(designer: Client, projectId: string, document: unknown, name = 'Domestic cold water') {
  const created = (await designer.send('POST', `/api/projects/${projectId}/systems`, { name, service: 'cold', document }).expect(201)).body;
  const base = `/api/projects/${projectId}/systems/${created.system.id}/revisions/${created.revision.id}`;
  const issued = await designer.send('POST', `${base}/issue`, { version: created.revision.version, attestation: ATTESTATION });
  if (issued.status !== 200) throw new Error(`issue failed: ${issued.status} ${JSON.stringify(issued.body)}`);
  return { systemId: created.system.id as string, revisionId: created.revision.id as string, base, revision: issued.body.revision };
}

/** Waits until the outbox row reaches `status` (the worker runs in the background). */
export async function waitForMessages(h: Harness, where: Record<string, unknown>, status: string, count: number, timeoutMs = 15_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const rows = await h.db('outbox').where(where);
    if (rows.length >= count && rows.every((r: { status: string }) => r.status === status)) return rows;
    if (Date.now() > deadline)
      throw new Error(
        `outbox rows ${JSON.stringify(rows.map((r: { status: string; last_error: string }) => [r.status, r.last_error]))} did not all reach ${status}`,
      );
    await new Promise((r) => setTimeout(r, 25));
  }
}
