/**
 * The inspector's review of a received summary: Received → Accepted, or Returned with comments
 * (overall and per item: a segment, a fixture, a device, a node or an input). A decision is
 * final for that revision; a returned design comes back as a new revision and a new review.
 */
import { conflict, forbidden, notFound, staleVersion } from './errors';
import { reviewsRepo, type ReviewRow } from '../repositories/reviews';
import { summariesRepo } from '../repositories/summaries';
import { systemsRepo } from '../repositories/systems';
import { auditRepo } from '../repositories/audit';
import { iso, type Tx } from '../db/rows';
import { toSummaryInfo } from './summaries';
import type { Actor, ServiceContext } from './context';
import { outboxService } from './outbox';
import { reviewDecidedMessage } from '../mail/messages';
import { acceptanceRecordApiPath } from '../../src/shared/api/reviewLoop';
import { itemLabel, reviewLoopService } from './reviewLoop';
import { resultViewPath, type DecideReviewBody, type InboxItem, type Review } from '../../src/shared/api/summaries';

async function present(db: Tx, rows: ReviewRow[]): Promise<Review[]> {
  const comments = rows.length
    ? await reviewsRepo.commentsFor(
        db,
        rows.map((r) => r.id),
      )
    : [];
  return rows.map((r) => ({
    id: r.id,
    projectId: r.project_id,
    systemId: r.system_id,
    systemName: r.system_name,
    revisionId: r.revision_id,
    revisionNumber: r.revision_number,
    revisionStatus: r.revision_status,
    reviewer: { id: r.reviewer_id, name: r.reviewer_name, email: r.reviewer_email },
    sentBy: r.sent_by_name,
    status: r.status,
    comment: r.comment,
    items: comments
      .filter((c) => c.review_id === r.id)
      .map((c) => ({
        id: c.id,
        itemType: c.item_type,
        itemId: c.item_id,
        comment: c.comment,
        reply: c.reply !== null ? { text: c.reply, by: c.replied_by_name, at: iso(c.replied_at ?? r.decided_at ?? r.received_at) } : null,
      })),
    version: r.version,
    receivedAt: iso(r.received_at),
    decidedAt: r.decided_at ? iso(r.decided_at) : null,
    packageId: r.package_id ?? null,
    answeredIn:
      r.answered_in_revision_id && r.answered_in_number !== null ? { revisionId: r.answered_in_revision_id, revisionNumber: r.answered_in_number } : null,
    acceptanceRecord:
      r.record_sha256 && r.record_file_name && r.record_created_at
        ? { url: acceptanceRecordApiPath(r.project_id, r.id), fileName: r.record_file_name, sha256: r.record_sha256, createdAt: iso(r.record_created_at) }
        : null,
  }));
}

/** What a review item names, in the words the designer typed (never an internal id). */
function itemWhere(document: unknown, itemType: string, itemId: string | null): string {
  if (!itemId) return itemType === 'general' ? 'General' : itemType;
  const doc = (document ?? {}) as {
    segments?: { id: string; label?: string }[];
    nodes?: { id: string; label?: string; checkedFixtures?: { id: string; label?: string }[] }[];
    devices?: { id: string; label?: string }[];
  };
  const fixtures = (doc.nodes ?? []).flatMap((n) => n.checkedFixtures ?? []);
  const named =
    itemType === 'segment'
      ? doc.segments?.find((x) => x.id === itemId)?.label
      : itemType === 'node'
        ? doc.nodes?.find((x) => x.id === itemId)?.label
        : itemType === 'device'
          ? doc.devices?.find((x) => x.id === itemId)?.label
          : itemType === 'fixture'
            ? fixtures.find((x) => x.id === itemId)?.label
            : undefined;
  return `${itemType} ${named ?? itemId}`;
}

/**
 * The designer who sent the summary hears the decision: one message through the outbox, in the same
 * transaction as the decision (so a decision is never recorded without its message, nor sent twice).
 */
async function notifySender(
  ctx: ServiceContext,
  trx: Tx,
  actor: Actor,
  review: ReviewRow,
  revisionNumber: number,
  body: { decision: 'accepted' | 'returned'; comment: string; items: { itemType: string; itemId: string | null; comment: string }[] },
): Promise<void> {
  if (!review.sent_by) return;
  const sender = await trx('users').where({ id: review.sent_by, status: 'active' }).first('id', 'email', 'name');
  if (!sender) return;
  const project = await trx('projects').where({ id: review.project_id }).first('name');
  const revision = await trx('revisions as v')
    .join('systems as s', 's.id', 'v.system_id')
    .where('v.id', review.revision_id)
    .first('v.document', 's.id as system_id', 's.name as system_name');
  const inspector = await trx('users').where({ id: actor.id }).first('name');
  const viewUrl = `${ctx.config.PUBLIC_URL.replace(/\/$/, '')}${resultViewPath(review.project_id, revision.system_id, review.revision_id)}`;
  const m = reviewDecidedMessage({
    recipientName: sender.name,
    inspectorName: inspector?.name ?? 'The inspector',
    projectName: project?.name ?? '',
    systemName: revision.system_name,
    revisionNumber,
    decision: body.decision,
    comment: body.comment,
    items: body.items.map((it) => ({ where: itemWhere(revision.document, it.itemType, it.itemId), comment: it.comment })),
    viewUrl,
  });
  await outboxService.enqueue(ctx, trx, {
    kind: 'review-decision',
    project_id: review.project_id,
    revision_id: review.revision_id,
    recipient_user_id: sender.id,
    to_address: sender.email,
    to_name: sender.name,
    subject: m.subject,
    text_body: m.text,
    created_by: actor.id,
  });
}

const presentIds = async (db: Tx, ids: string[]) => present(db, await reviewsRepo.byIds(db, ids));

export const reviewsService = {
  byIds: presentIds,

  reply: (ctx: ServiceContext, actor: Actor, projectId: string, reviewId: string, commentId: string, reply: string) =>
    reviewLoopService.reply(ctx, actor, projectId, reviewId, commentId, reply, presentIds),

  answers: (ctx: ServiceContext, projectId: string, systemId: string, revisionId: string) =>
    reviewLoopService.answers(ctx, projectId, systemId, revisionId, presentIds),

  async forRevision(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string): Promise<Review[]> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const rows = (await reviewsRepo.forRevision(ctx.db, revisionId)).filter((r) => r.system_id === systemId);
    return present(ctx.db, rows);
  },

  forProject: async (ctx: ServiceContext, projectId: string) => present(ctx.db, await reviewsRepo.forProject(ctx.db, projectId)),

  async inbox(ctx: ServiceContext, actor: Actor): Promise<InboxItem[]> {
    const rows = await reviewsRepo.forReviewer(ctx.db, actor.id);
    const reviews = await present(ctx.db, rows);
    const summaries = rows.length
      ? await summariesRepo.findManyByRevision(
          ctx.db,
          rows.map((r) => r.revision_id),
        )
      : [];
    const projects = rows.length
      ? await ctx
          .db('projects')
          .whereIn('id', [...new Set(rows.map((r) => r.project_id))])
          .select('id', 'name', 'address')
      : [];
    return reviews.map((review) => {
      const s = summaries.find((x) => x.revision_id === review.revisionId);
      const p = projects.find((x: { id: string }) => x.id === review.projectId);
      return {
        review,
        project: { id: review.projectId, name: p?.name ?? '', address: p?.address ?? '' },
        summary: s ? toSummaryInfo(s, review.systemId) : null,
        viewPath: resultViewPath(review.projectId, review.systemId, review.revisionId),
      };
    });
  },

  async decide(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    reviewId: string,
    body: DecideReviewBody & { comment: string; items: { itemType: Review['items'][number]['itemType']; itemId: string | null; comment: string }[] },
  ): Promise<Review> {
    return ctx.db.transaction(async (trx) => {
      const current = await reviewsRepo.lock(trx, projectId, reviewId);
      if (!current) throw notFound('The review');
      if (current.reviewer_id !== actor.id) throw forbidden('Only the inspector it was sent to decides this review.');
      if (current.status !== 'received') throw conflict(`This review is already ${current.status}.`);
      if (current.version !== body.version) throw staleVersion();
      const revision = await trx('revisions').where({ id: current.revision_id }).first('status', 'number');
      if (revision.status !== 'issued') throw conflict(`Revision ${revision.number} has been superseded; review the current revision.`);
      if (!(await reviewsRepo.decide(trx, reviewId, body.version, { status: body.decision, comment: body.comment }))) throw staleVersion();
      await reviewsRepo.addComments(trx, reviewId, body.items);
      await notifySender(ctx, trx, actor, current, revision.number, body);
      if (body.decision === 'accepted') {
        const { document } = await trx('revisions').where({ id: current.revision_id }).first('document');
        await reviewLoopService.recordAcceptance(trx, reviewId, (type, id) => itemLabel([document], type, id));
      }
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: `review.${body.decision}`,
        subjectType: 'review',
        subjectId: reviewId,
        details: { revisionId: current.revision_id, number: revision.number, comments: body.items.length + (body.comment ? 1 : 0) },
      });
      return (await present(trx, await reviewsRepo.byIds(trx, [reviewId])))[0];
    });
  },
};
