/**
 * The field change's life as one table: from which state an action may be taken, by whom, to which
 * state it leads, what the audit log calls it and who is told by e-mail. `runTransition` is the only
 * way a field change changes: it takes the locks in the documented order (server/repositories/
 * locks.ts: the system, then the field change), checks the state, the actor and the version, lets
 * the action do its own work and checks, moves the row, writes the audit entry and queues the mail
 * through the outbox service, all in one transaction.
 *
 *   draft ──save──▶ draft ──propose──▶ proposed ──accept──▶ accepted
 *                                         └──────decline──▶ declined
 */
import { auditRepo } from '../repositories/audit';
import { fieldChangesRepo, type FieldChangeRow } from '../repositories/fieldChanges';
import { locks } from '../repositories/locks';
import { usersRepo } from '../repositories/users';
import type { Tx } from '../db/rows';
import type { FieldChangeStatus } from '../../src/shared/api/fieldChanges';
import { conflict, forbidden, notFound, staleVersion } from './errors';
import { outboxService } from './outbox';
import type { Actor, ServiceContext } from './context';

export type FieldChangeAction = 'save' | 'propose' | 'accept' | 'decline';

export interface Transition {
  action: FieldChangeAction;
  from: FieldChangeStatus;
  to: FieldChangeStatus;
  /** who may take it: the contractor who started the field change, or one of the project's designers (the route checks the role) */
  by: 'author' | 'designer';
  /** the audit log's name of the step */
  audit: string;
  /** who is told by e-mail */
  mail: 'designers' | 'author' | null;
  /** what the refusal says when the field change is in another state, by that state */
  refusal: Partial<Record<FieldChangeStatus, string>>;
}

const decided = 'it is decided already.';

export const TRANSITIONS: Readonly<Record<FieldChangeAction, Transition>> = Object.freeze({
  save: {
    action: 'save',
    from: 'draft',
    to: 'draft',
    by: 'author',
    audit: 'field-change.saved',
    mail: null,
    refusal: {
      proposed: 'only a draft field change is edited.',
      accepted: 'only a draft field change is edited.',
      declined: 'only a draft field change is edited.',
    },
  },
  propose: {
    action: 'propose',
    from: 'draft',
    to: 'proposed',
    by: 'author',
    audit: 'field-change.proposed',
    mail: 'designers',
    refusal: { proposed: 'only a draft is proposed.', accepted: 'only a draft is proposed.', declined: 'only a draft is proposed.' },
  },
  accept: {
    action: 'accept',
    from: 'proposed',
    to: 'accepted',
    by: 'designer',
    audit: 'field-change.accepted',
    mail: 'author',
    refusal: { draft: 'its contractor proposes it before it is accepted.', accepted: decided, declined: decided },
  },
  decline: {
    action: 'decline',
    from: 'proposed',
    to: 'declined',
    by: 'designer',
    audit: 'field-change.declined',
    mail: 'author',
    refusal: { draft: 'its contractor proposes it before it is declined.', accepted: decided, declined: decided },
  },
});

const stateWords: Record<FieldChangeStatus, string> = { draft: 'a draft', proposed: 'proposed', accepted: 'accepted', declined: 'declined' };

/** What an action's own step hands back to the runner. */
export interface StepOutcome<T> {
  /** columns set with the move (decided_by, proposed_at …); for 'save', the draft's new values */
  set?: Record<string, unknown>;
  /** the audit entry's details */
  details: Record<string, unknown>;
  /** the e-mail to each recipient the table names (the project's designers, or the contractor who started it) */
  message?: (recipient: { name: string }) => { subject: string; text: string };
  /** more audit entries the step caused (a revision drafted from the field change) */
  moreAudit?: { action: string; subjectType: string; subjectId: string; details: Record<string, unknown> }[];
  result: T;
}

export interface TransitionRequest {
  projectId: string;
  systemId: string;
  id: string;
  version: number;
  action: FieldChangeAction;
}

/**
 * Runs one transition of the table. `step` does the action's own checks and work inside the
 * transaction, after the locks and the state, actor and version checks, and before the row moves.
 */
export async function runTransition<T>(
  ctx: ServiceContext,
  actor: Actor,
  req: TransitionRequest,
  step: (trx: Tx, row: FieldChangeRow) => Promise<StepOutcome<T>>,
): Promise<T> {
  const t = TRANSITIONS[req.action];
  return ctx.db.transaction(async (trx) => {
    await locks.system(trx, req.systemId);
    const row = await locks.fieldChange(trx, req.projectId, req.systemId, req.id);
    if (!row) throw notFound('The field change');
    if (t.by === 'author' && row.created_by !== actor.id) throw forbidden('Only the contractor who started this field change changes it.');
    if (row.status !== t.from)
      throw conflict(`Field change ${row.number} is ${stateWords[row.status]}; ${t.refusal[row.status] ?? 'that step does not apply.'}`);
    if (row.version !== req.version) throw staleVersion();

    const outcome = await step(trx, row);

    const moved =
      t.action === 'save'
        ? await fieldChangesRepo.updateDraft(trx, row.id, req.version, outcome.set ?? {})
        : await fieldChangesRepo.transition(trx, row.id, req.version, t.from, t.to, outcome.set ?? {});
    if (!moved) throw staleVersion();

    await auditRepo.record(trx, {
      actorId: actor.id,
      projectId: req.projectId,
      action: t.audit,
      subjectType: 'field-change',
      subjectId: row.id,
      details: { number: row.number, ...(t.action === 'save' ? { version: moved.version } : {}), ...outcome.details },
    });
    for (const a of outcome.moreAudit ?? []) await auditRepo.record(trx, { actorId: actor.id, projectId: req.projectId, ...a });
    const recipients =
      !t.mail || !outcome.message
        ? []
        : t.mail === 'designers'
          ? await fieldChangesRepo.designers(trx, req.projectId)
          : [await usersRepo.findById(trx, row.created_by)].filter((u) => !!u);
    for (const to of recipients) {
      const m = outcome.message!(to);
      await outboxService.enqueue(ctx, trx, {
        kind: 'field-change',
        project_id: req.projectId,
        field_change_id: row.id,
        recipient_user_id: to.id,
        to_address: to.email,
        to_name: to.name,
        subject: m.subject,
        text_body: m.text,
        created_by: actor.id,
      });
    }
    return outcome.result;
  });
}
