import { conflict, notFound } from './errors';
import { outboxRepo, type NewOutboxMessage, type OutboxRow } from '../repositories/outbox';
import { auditRepo } from '../repositories/audit';
import { iso, type Tx } from '../db/rows';
import { invitationMessage } from '../mail/messages';
import { messageIdOf } from '../mail/worker';
import type { Actor, ServiceContext } from './context';
import type { MessageInfo } from '../../src/shared/api/summaries';

export const toMessageInfo = (r: OutboxRow, publicUrl: string): MessageInfo => ({
  id: r.id,
  kind: r.kind,
  toAddress: r.to_address,
  toName: r.to_name,
  recipientUserId: r.recipient_user_id,
  subject: r.subject,
  status: r.status,
  attempts: r.attempts,
  maxAttempts: r.max_attempts,
  nextAttemptAt: r.status === 'queued' ? iso(r.next_attempt_at) : null,
  lastError: r.last_error,
  sentAt: r.sent_at ? iso(r.sent_at) : null,
  createdAt: iso(r.created_at),
  messageId: messageIdOf(r.id, publicUrl),
});

export const outboxService = {
  /** Writes a message to the outbox inside the caller's transaction: it is sent only if that commits. */
  enqueue: (ctx: ServiceContext, trx: Tx, message: Omit<NewOutboxMessage, 'max_attempts'>) =>
    outboxRepo.insert(trx, { ...message, max_attempts: ctx.config.OUTBOX_MAX_ATTEMPTS }),

  /** An invitation or password-reset link by e-mail; the link itself is kept apart from the body. */
  enqueueAccountLink: (
    ctx: ServiceContext,
    trx: Tx,
    o: { userId: string; email: string; name: string; url: string; expiresAt: string; purpose: 'invitation' | 'password-reset'; createdBy: string | null },
  ) => {
    const m = invitationMessage({ name: o.name, expiresAt: o.expiresAt, purpose: o.purpose });
    return outboxService.enqueue(ctx, trx, {
      kind: o.purpose,
      recipient_user_id: o.userId,
      to_address: o.email,
      to_name: o.name,
      subject: m.subject,
      text_body: m.text,
      secret_url: o.url,
      created_by: o.createdBy,
    });
  },

  /** The messages about a revision of the project (the project is part of the query: a revision id alone reveals nothing). */
  async listForRevision(ctx: ServiceContext, projectId: string, revisionId: string): Promise<MessageInfo[]> {
    return (await outboxRepo.listForRevision(ctx.db, projectId, revisionId)).map((r) => toMessageInfo(r, ctx.config.PUBLIC_URL));
  },

  async retry(ctx: ServiceContext, actor: Actor, projectId: string, messageId: string): Promise<MessageInfo> {
    return ctx.db.transaction(async (trx) => {
      const current = await outboxRepo.find(trx, projectId, messageId);
      if (!current) throw notFound('The message');
      if (current.status !== 'failed') throw conflict(`The message is ${current.status}; only a failed message is sent again.`);
      const row = await outboxRepo.requeue(trx, messageId);
      if (!row) throw conflict('The message changed meanwhile; reload.');
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'message.requeued',
        subjectType: 'message',
        subjectId: messageId,
        details: { to: row.to_address },
      });
      return toMessageInfo(row, ctx.config.PUBLIC_URL);
    });
  },
};
