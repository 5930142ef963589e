/**
 * The review loop after a decision: the "returned to you" marker, the designer's replies to the
 * comments of a returned review (frozen once the next revision is issued), the responses printed in
 * the next summary, the compare the inspector sees on the revision that answers a returned one, and
 * the acceptance record stored when the inspector accepts.
 */
import { createHash } from 'node:crypto';
import { readSystemDocument, type SystemDocument } from '../../src/engine';
import { conflict, notFound } from './errors';
import { acceptanceRecordsRepo, reviewsRepo, type ReviewRow } from '../repositories/reviews';
import { summariesRepo } from '../repositories/summaries';
import { systemsRepo } from '../repositories/systems';
import { auditRepo } from '../repositories/audit';
import { iso, type Tx } from '../db/rows';
import { renderAcceptanceRecord } from '../pdf/acceptanceRecord';
import type { ReviewResponses } from '../pdf/sections/reviewResponses';
import { compareDocuments } from './fieldChangeComparison';
import { describeChanges } from './fieldChangeRules';
import type { Actor, ServiceContext } from './context';
import type { ReturnedMarker } from '../../src/shared/api/systems';
import type { Answers, RevisionCompare } from '../../src/shared/api/reviewLoop';
import type { ChangeItem } from '../../src/shared/api/fieldChanges';
import type { Review } from '../../src/shared/api/summaries';

const ITEM_WORD: Record<string, string> = {
  segment: 'Segment',
  fixture: 'Checked fixture',
  device: 'Device',
  node: 'Node',
  input: 'Input',
  general: 'General',
};

type NamedDoc = {
  segments?: { id: string; label?: string }[];
  nodes?: { id: string; label?: string; checkedFixtures?: { id: string; label?: string }[] }[];
  devices?: { id: string; label?: string }[];
};

/**
 * What a review item names, as the designer typed it: "Segment Riser to level 2". Looked up in each
 * document given, in order (the returned revision first); an unnamed or vanished item never prints
 * its internal id.
 */
export function itemLabel(documents: unknown[], itemType: string, itemId: string | null): string {
  const word = ITEM_WORD[itemType] ?? itemType;
  if (itemType === 'general' || !itemId) return word;
  if (itemType === 'input') return `${word}: ${itemId}`;
  for (const d of documents) {
    const doc = (d ?? {}) as NamedDoc;
    const named =
      itemType === 'segment'
        ? doc.segments?.find((x) => x.id === itemId)?.label
        : itemType === 'node'
          ? doc.nodes?.find((x) => x.id === itemId)?.label
          : itemType === 'device'
            ? doc.devices?.find((x) => x.id === itemId)?.label
            : itemType === 'fixture'
              ? (doc.nodes ?? []).flatMap((n) => n.checkedFixtures ?? []).find((x) => x.id === itemId)?.label
              : undefined;
    if (named) return `${word} ${named}`;
  }
  return `${word} (unnamed)`;
}

const documentOf = (stored: unknown): SystemDocument | null => {
  const read = readSystemDocument(stored, { riseConflict: 'keep-elevations' });
  return read.success ? read.data : null;
};

/** Segments added or removed between the two revisions (the field-change words cover changed ones and devices). */
function segmentAdditions(before: SystemDocument, after: SystemDocument): ChangeItem[] {
  const had = new Set(before.segments.map((s) => s.id));
  const has = new Set(after.segments.map((s) => s.id));
  const out: ChangeItem[] = [];
  for (const s of before.segments)
    if (!has.has(s.id))
      out.push({
        elementType: 'segment',
        elementId: s.id,
        label: s.label ?? 'unnamed segment',
        change: 'removed',
        fields: [],
        text: `Segment ${s.label ?? '(unnamed)'} removed`,
      });
  for (const s of after.segments)
    if (!had.has(s.id))
      out.push({
        elementType: 'segment',
        elementId: s.id,
        label: s.label ?? 'unnamed segment',
        change: 'added',
        fields: [],
        text: `Segment ${s.label ?? '(unnamed)'} added`,
      });
  return out;
}

/** The compare of the returned revision against the one that answers it: the field-change comparison, reused. */
export function compareRevisions(returned: { id: string; number: number; document: unknown }, answering: { document: unknown }): RevisionCompare | null {
  const a = documentOf(returned.document);
  const b = documentOf(answering.document);
  if (!a || !b) return null;
  const changes = [...describeChanges(a, b), ...segmentAdditions(a, b)];
  const comparison = compareDocuments(a, b, changes);
  return { ...comparison, returnedRevision: { id: returned.id, number: returned.number }, changes };
}

export const reviewLoopService = {
  /** Per system, the "returned to you" marker (absent when the newest decision is not a return). */
  async markers(db: Tx, systemIds: string[]): Promise<Map<string, ReturnedMarker>> {
    const rows = await reviewsRepo.newestDecisions(db, systemIds);
    return new Map(
      rows
        .filter((r) => r.status === 'returned')
        .map((r) => [
          r.system_id,
          {
            reviewId: r.review_id,
            revisionId: r.revision_id,
            revisionNumber: r.revision_number,
            reviewerName: r.reviewer_name,
            decidedAt: iso(r.decided_at),
            comments: r.comments,
            answered: r.answered,
          },
        ]),
    );
  },

  /** How many systems of each project are returned (for the projects list). */
  async returnedCounts(db: Tx, projectIds: string[]): Promise<Map<string, number>> {
    if (!projectIds.length) return new Map();
    const systems: { id: string; project_id: string }[] = await db('systems').whereIn('project_id', projectIds).select('id', 'project_id');
    const markers = await this.markers(
      db,
      systems.map((s) => s.id),
    );
    const counts = new Map<string, number>();
    for (const s of systems) if (markers.has(s.id)) counts.set(s.project_id, (counts.get(s.project_id) ?? 0) + 1);
    return counts;
  },

  /**
   * The designer's reply to one comment of a returned review. Refused once the next revision is
   * issued (the replies are then part of its summary) and on a review that was not returned.
   */
  async reply(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    reviewId: string,
    commentId: string,
    reply: string,
    present: (db: Tx, ids: string[]) => Promise<Review[]>,
  ): Promise<Review> {
    return ctx.db.transaction(async (trx) => {
      const review = await reviewsRepo.lock(trx, projectId, reviewId);
      if (!review) throw notFound('The review');
      const comment = await reviewsRepo.lockComment(trx, reviewId, commentId);
      if (!comment) throw notFound('The comment');
      if (review.status !== 'returned') throw conflict(`This review is ${review.status}; only the comments of a returned review are answered.`);
      const revision = await trx('revisions').where({ id: review.revision_id }).first('status', 'number');
      if (review.answered_in_revision_id || revision.status !== 'issued') {
        throw conflict(`The replies to the review of revision ${revision.number} are frozen: a newer revision has been issued with them.`);
      }
      await reviewsRepo.setReply(trx, commentId, reply, actor.id);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'review.comment-answered',
        subjectType: 'review',
        subjectId: reviewId,
        details: { commentId, revisionNumber: revision.number },
      });
      return (await present(trx, [reviewId]))[0];
    });
  },

  /** In the transaction that issues a revision: the returned reviews of the revision it supersedes are answered by it. */
  markAnswered: (trx: Tx, systemId: string, newRevisionId: string) => reviewsRepo.markAnswered(trx, systemId, newRevisionId),

  /** What the summary of `revisionId` prints under "Response to review comments". */
  async responsesFor(trx: Tx, revisionId: string, answeringDocument: unknown): Promise<ReviewResponses[]> {
    const reviews = await reviewsRepo.answeredBy(trx, revisionId);
    if (!reviews.length) return [];
    const comments = await reviewsRepo.commentsFor(
      trx,
      reviews.map((r) => r.id),
    );
    const docs = new Map<string, unknown>();
    for (const r of reviews)
      if (!docs.has(r.revision_id)) docs.set(r.revision_id, (await trx('revisions').where({ id: r.revision_id }).first('document'))?.document);
    return [...reviews]
      .sort((x, y) => x.revision_number - y.revision_number || iso(x.decided_at ?? x.received_at).localeCompare(iso(y.decided_at ?? y.received_at)))
      .map((r) => ({
        returnedRevisionNumber: r.revision_number,
        reviewerName: r.reviewer_name,
        decidedAt: iso(r.decided_at ?? r.received_at),
        overall: r.comment,
        comments: comments
          .filter((c) => c.review_id === r.id)
          .map((c) => ({ item: itemLabel([docs.get(r.revision_id), answeringDocument], c.item_type, c.item_id), comment: c.comment, reply: c.reply })),
      }));
  },

  /** The returned reviews a revision answers, and what changed since the returned revision. */
  async answers(
    ctx: ServiceContext,
    projectId: string,
    systemId: string,
    revisionId: string,
    present: (db: Tx, ids: string[]) => Promise<Review[]>,
  ): Promise<Answers | null> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const rows: ReviewRow[] = (await reviewsRepo.answeredBy(ctx.db, revisionId)).filter((r) => r.system_id === systemId);
    if (!rows.length) return null;
    const newest = [...rows].sort((x, y) => y.revision_number - x.revision_number)[0];
    const [returned, answering] = await Promise.all([
      ctx.db('revisions').where({ id: newest.revision_id }).first('id', 'number', 'document'),
      ctx.db('revisions').where({ id: revisionId, system_id: systemId }).first('document'),
    ]);
    if (!answering) throw notFound('The revision');
    const compare = compareRevisions(returned, answering);
    if (!compare) return null;
    return {
      reviews: await present(
        ctx.db,
        rows.map((r) => r.id),
      ),
      compare,
    };
  },

  /** In the accepting transaction: the one-page acceptance record, made and stored. */
  async recordAcceptance(trx: Tx, reviewId: string, labels: (itemType: string, itemId: string | null) => string) {
    const review = (await reviewsRepo.byIds(trx, [reviewId]))[0];
    const project = await trx('projects').where({ id: review.project_id }).first('*');
    const revision = await trx('revisions as v')
      .leftJoin('users as u', 'u.id', 'v.issued_by')
      .where('v.id', review.revision_id)
      .first('v.number', 'v.issued_at', 'v.updated_at', 'v.input_hash', 'v.document', 'u.name as preparer_name');
    const summary = await summariesRepo.findByRevision(trx, review.revision_id);
    const comments = await reviewsRepo.commentsFor(trx, [reviewId]);
    // the project's permit or plan-check number, as the designer entered it (projects.permit, a JSON of PermitFields)
    const permit = (project as { permit?: { permitNumber?: unknown } | null }).permit?.permitNumber;
    const doc = documentOf(revision.document);
    const { bytes } = await renderAcceptanceRecord({
      projectName: project.name,
      address: project.address,
      permitNumber: typeof permit === 'string' && permit.trim() ? permit.trim() : null,
      systemName: review.system_name,
      revisionNumber: revision.number,
      issuedAt: iso(revision.issued_at ?? revision.updated_at),
      inputHash: revision.input_hash ?? '',
      summarySha256: summary?.sha256 ?? null,
      preparerName: revision.preparer_name ?? 'unknown',
      reviewerName: review.reviewer_name,
      reviewerEmail: review.reviewer_email,
      decidedAt: iso(review.decided_at ?? new Date()),
      comment: review.comment,
      items: comments.map((c) => ({ item: labels(c.item_type, c.item_id), comment: c.comment })),
      unitSystem: doc?.unitSystem ?? project.unit_system ?? 'US',
    });
    const pdf = Buffer.from(bytes);
    const safe = (s: string) =>
      s
        .replace(/[^A-Za-z0-9 ._-]+/g, '')
        .trim()
        .replace(/\s+/g, ' ')
        .slice(0, 80) || 'system';
    await acceptanceRecordsRepo.insert(trx, {
      review_id: reviewId,
      project_id: review.project_id,
      revision_id: review.revision_id,
      file_name: `Acceptance record - ${safe(project.name)} - ${safe(review.system_name)} - revision ${revision.number}.pdf`,
      pdf,
      sha256: createHash('sha256').update(pdf).digest('hex'),
      byte_length: pdf.length,
    });
  },

  async acceptancePdf(ctx: ServiceContext, projectId: string, reviewId: string) {
    const row = await acceptanceRecordsRepo.pdfOf(ctx.db, projectId, reviewId);
    if (!row) throw notFound('The acceptance record (only an accepted review has one)');
    return { bytes: row.pdf, sha256: row.sha256, fileName: row.file_name };
  },
};
