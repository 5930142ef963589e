/**
 * The outbox worker: sends the messages the services wrote to the outbox table.
 *
 * Delivery guarantees:
 * - Nothing is lost: a message is a row written in the same transaction as the change that
 *   caused it, and it stays until the SMTP server has accepted it (its reply after DATA).
 * - Claiming: a worker takes due rows with UPDATE … WHERE id IN (SELECT … FOR UPDATE SKIP LOCKED)
 *   and stamps them with its name and a lease; two workers never hold one row. A worker that
 *   stops hands back the rows it had not tried yet.
 * - Retries: an attempt that fails (connection refused, timeout, a 4xx/5xx reply) puts the row
 *   back with a delay of base·2^(attempt−1), capped; after the last attempt it is marked failed
 *   with the reason, which the sender sees.
 * - Duplicates: the one window left is a crash after the SMTP server accepted the message and
 *   before the row was marked sent. Then the lease runs out and the message is sent again — with
 *   the same Message-ID (<outbox row id@host>), so a receiving system or a person can recognise it
 *   as the same message. SMTP offers no exactly-once hand-over; this keeps the window to the few
 *   milliseconds between the server's 250 and our UPDATE.
 */
import { randomUUID } from 'node:crypto';
import type { ServiceContext } from '../services/context';
import { outboxRepo, type OutboxRow } from '../repositories/outbox';
import { summariesRepo } from '../repositories/summaries';
import { auditRepo } from '../repositories/audit';
import type { Mailer } from './transport';
import { SECRET_URL } from './messages';
import { log } from '../log';

export interface WorkerOptions {
  pollMs: number;
  retryBaseMs: number;
  retryMaxMs: number;
  leaseSeconds: number;
  /** rows claimed at a time (a choice: small, so a stop hands back little) */
  batch?: number;
}

export const messageIdOf = (id: string, publicUrl: string) => `<${id}@${new URL(publicUrl).hostname || 'headroom'}>`;

export class OutboxWorker {
  readonly name = `worker-${randomUUID().slice(0, 8)}`;
  private running: Promise<void> | null = null;
  private stopping = false;
  private wake: (() => void) | null = null;

  constructor(
    private readonly ctx: ServiceContext,
    private readonly mailer: Mailer,
    private readonly opts: WorkerOptions,
  ) {}

  get isRunning() {
    return this.running !== null;
  }

  start() {
    if (this.running) return;
    this.stopping = false;
    this.running = this.loop();
  }

  /** Finishes the message in hand, hands back the rest of the batch, and resolves. */
  async stop() {
    this.stopping = true;
    this.wake?.();
    await this.running;
    this.running = null;
  }

  /** Looks now instead of at the next poll. */
  kick() {
    this.wake?.();
  }

  private async loop() {
    while (!this.stopping) {
      let handled = 0;
      try {
        handled = await this.runOnce();
      } catch (err) {
        if (!this.stopping) log.error({ err }, 'outbox worker');
      }
      if (handled === 0 && !this.stopping) {
        await new Promise<void>((resolve) => {
          const t = setTimeout(resolve, this.opts.pollMs);
          this.wake = () => {
            clearTimeout(t);
            resolve();
          };
        });
        this.wake = null;
      }
    }
  }

  /** Claims one batch and tries each message once; returns how many were tried. */
  async runOnce(): Promise<number> {
    const rows = await outboxRepo.claim(this.ctx.db, this.name, this.opts.batch ?? 5, this.opts.leaseSeconds);
    let tried = 0;
    for (const row of rows) {
      if (this.stopping) break;
      await this.deliver(row);
      tried++;
    }
    if (tried < rows.length)
      await outboxRepo.release(
        this.ctx.db,
        rows.slice(tried).map((r) => r.id),
        this.name,
      );
    return tried;
  }

  private async deliver(row: OutboxRow) {
    const { db, config } = this.ctx;
    let response: string;
    try {
      const attachments = [];
      // one PDF, or one per system of a building's submission (in the order sent)
      for (const summaryId of [row.attachment_summary_id, ...(row.extra_summary_ids ?? [])]) {
        if (!summaryId) continue;
        const pdf = await summariesRepo.pdf(db, summaryId);
        if (!pdf) throw new Error('the summary PDF is not ready');
        const summary = await db('summaries').where({ id: summaryId }).first('header');
        attachments.push({ filename: summaryFileName(summary.header), content: pdf, contentType: 'application/pdf' });
      }
      const text = row.text_body.split(SECRET_URL).join(row.secret_url ?? '(this link is no longer available: ask for a new one)');
      const sent = await this.mailer.send({
        messageId: messageIdOf(row.id, config.PUBLIC_URL),
        to: { name: row.to_name, address: row.to_address },
        subject: row.subject,
        text,
        headers: { 'X-Headroom-Outbox-Id': row.id },
        attachments,
      });
      response = sent.response;
    } catch (err) {
      const reason = describe(err);
      if (row.attempts >= row.max_attempts) {
        await outboxRepo.markFailed(db, row.id, this.name, reason);
        await auditRepo.record(db, {
          actorId: null,
          projectId: row.project_id,
          action: 'message.failed',
          subjectType: 'message',
          subjectId: row.id,
          details: { to: row.to_address, attempts: row.attempts, reason },
        });
      } else {
        const delay = Math.min(this.opts.retryBaseMs * 2 ** (row.attempts - 1), this.opts.retryMaxMs);
        await outboxRepo.markRetry(db, row.id, this.name, reason, delay);
      }
      return;
    }
    if (await outboxRepo.markSent(db, row.id, this.name, response)) {
      await auditRepo.record(db, {
        actorId: null,
        projectId: row.project_id,
        action: 'message.sent',
        subjectType: 'message',
        subjectId: row.id,
        details: { to: row.to_address, kind: row.kind, attempts: row.attempts },
      });
    }
  }
}

/** "headroom-alder-finch-cold-water-r3.pdf" */
export function summaryFileName(header: { projectName: string; systemName: string; revisionNumber: number }) {
  const slug = (s: string) =>
    s
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .toLowerCase()
      .replace(/[\s_]+/g, '-')
      .slice(0, 40);
  return `headroom-${slug(header.projectName)}-${slug(header.systemName)}-r${header.revisionNumber}.pdf`.replace(/-+/g, '-');
}

function describe(err: unknown): string {
  const e = err as { code?: string; responseCode?: number; response?: string; message?: string };
  const parts = [e?.code, e?.responseCode ? String(e.responseCode) : null, e?.response ?? e?.message].filter(Boolean);
  return parts.join(' ').slice(0, 500) || 'unknown error';
}
