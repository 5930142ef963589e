import type { Tx } from '../db/rows';

export interface OutboxRow {
  id: string;
  kind: 'summary' | 'invitation' | 'password-reset' | 'field-change' | 'review-decision';
  project_id: string | null;
  revision_id: string | null;
  /** the field change a 'field-change' message is about */
  field_change_id?: string | null;
  recipient_user_id: string | null;
  to_address: string;
  to_name: string;
  subject: string;
  text_body: string;
  secret_url: string | null;
  attachment_summary_id: string | null;
  /** more summary PDFs attached after the first (one submission for a building) */
  extra_summary_ids?: string[] | null;
  status: 'queued' | 'sending' | 'sent' | 'failed';
  attempts: number;
  max_attempts: number;
  next_attempt_at: Date;
  lease_owner: string | null;
  lease_until: Date | null;
  last_error: string | null;
  smtp_response: string | null;
  sent_at: Date | null;
  created_by: string | null;
  created_at: Date;
  updated_at: Date;
}

export type NewOutboxMessage = Pick<OutboxRow, 'kind' | 'to_address' | 'subject' | 'text_body' | 'max_attempts'> &
  Partial<
    Pick<
      OutboxRow,
      | 'project_id'
      | 'revision_id'
      | 'field_change_id'
      | 'recipient_user_id'
      | 'to_name'
      | 'secret_url'
      | 'attachment_summary_id'
      | 'extra_summary_ids'
      | 'created_by'
    >
  >;

export const outboxRepo = {
  async insert(db: Tx, values: NewOutboxMessage): Promise<OutboxRow> {
    const [row] = await db<OutboxRow>('outbox').insert(values).returning('*');
    return row as OutboxRow;
  },
  listForRevision: (db: Tx, projectId: string, revisionId: string) =>
    db<OutboxRow>('outbox')
      .where({ project_id: projectId, revision_id: revisionId })
      .orderBy([{ column: 'created_at', order: 'desc' }, 'to_address']),
  find: (db: Tx, projectId: string, id: string) => db<OutboxRow>('outbox').where({ id, project_id: projectId }).first(),

  /**
   * Claims up to `limit` due messages for `owner`: queued ones whose time has come, and ones
   * whose sender's lease ran out (it crashed or lost the database). FOR UPDATE SKIP LOCKED lets
   * several workers claim at once without waiting on, or taking, each other's rows.
   */
  async claim(db: Tx, owner: string, limit: number, leaseSeconds: number): Promise<OutboxRow[]> {
    const { rows } = await db.raw(
      `UPDATE outbox SET status = 'sending', attempts = attempts + 1, lease_owner = ?, lease_until = now() + make_interval(secs => ?), updated_at = now()
        WHERE id IN (
          SELECT id FROM outbox
           WHERE (status = 'queued' AND next_attempt_at <= now()) OR (status = 'sending' AND lease_until < now())
           ORDER BY next_attempt_at
           LIMIT ?
           FOR UPDATE SKIP LOCKED)
        RETURNING *`,
      [owner, leaseSeconds, limit],
    );
    return rows as OutboxRow[];
  },
  /** Only the lease holder marks; false when the lease was lost to another worker meanwhile. */
  async markSent(db: Tx, id: string, owner: string, smtpResponse: string): Promise<boolean> {
    const n = await db('outbox').where({ id, lease_owner: owner, status: 'sending' }).update({
      status: 'sent',
      sent_at: db.fn.now(),
      smtp_response: smtpResponse,
      secret_url: null,
      lease_owner: null,
      lease_until: null,
      last_error: null,
      updated_at: db.fn.now(),
    });
    return n === 1;
  },
  async markRetry(db: Tx, id: string, owner: string, error: string, delayMs: number): Promise<boolean> {
    const n = await db('outbox')
      .where({ id, lease_owner: owner, status: 'sending' })
      .update({
        status: 'queued',
        last_error: error,
        lease_owner: null,
        lease_until: null,
        next_attempt_at: db.raw(`now() + make_interval(secs => ?)`, [delayMs / 1000]),
        updated_at: db.fn.now(),
      });
    return n === 1;
  },
  /** The one-time link stays: the sender may queue the message again while the link is valid. */
  async markFailed(db: Tx, id: string, owner: string, error: string): Promise<boolean> {
    const n = await db('outbox')
      .where({ id, lease_owner: owner, status: 'sending' })
      .update({ status: 'failed', last_error: error, lease_owner: null, lease_until: null, updated_at: db.fn.now() });
    return n === 1;
  },
  /** A worker that stops hands back what it claimed but did not try (the attempt is not counted). */
  release: (db: Tx, ids: string[], owner: string) =>
    db('outbox')
      .whereIn('id', ids)
      .where({ lease_owner: owner, status: 'sending' })
      .update({ status: 'queued', attempts: db.raw('attempts - 1'), lease_owner: null, lease_until: null, updated_at: db.fn.now() }),
  /** A failed message queued again by its sender, with a fresh set of attempts. */
  async requeue(db: Tx, id: string): Promise<OutboxRow | undefined> {
    const [row] = await db<OutboxRow>('outbox')
      .where({ id, status: 'failed' })
      .update({ status: 'queued', attempts: 0, next_attempt_at: db.fn.now(), updated_at: db.fn.now() })
      .returning('*');
    return row as OutboxRow | undefined;
  },
};
