/**
 * The review loop after the inspector's decision: the designer answers each comment of a returned
 * review, the next issued revision carries the answers, the inspector's review of it shows what
 * changed since the returned revision, and an accepted review has a printable acceptance record.
 *
 * Routes (all under /api; "member" = any role in the project; a non-member gets 404):
 *
 *   PUT  /projects/:projectId/reviews/:reviewId/comments/:commentId/reply                designer  ReplyBody → ReviewResponse
 *        (only on a returned review whose revision is still the issued one: replies freeze when the next revision is issued)
 *   GET  /projects/:projectId/systems/:systemId/revisions/:revisionId/answers              member    → AnswersResponse
 *        (the returned review(s) this revision answers, with the replies and the compare against the returned revision)
 *   GET  /projects/:projectId/reviews/:reviewId/acceptance.pdf                             member    → application/pdf (accepted reviews only)
 *   POST /projects/:projectId/submissions                                                  designer  SendPackageBody → 202 SendPackageResponse
 *        (one submission for a building: each chosen system's issued revision, one e-mail per inspector with one PDF per
 *         system attached, one review per system and inspector grouped by the package, so the comments stay per system)
 *
 * The "returned to you" marker travels on SystemInfo.returned (systems.ts) and Project.returnedSystems (projects.ts).
 */
import { z } from 'zod';
import { ProjectParams } from './projects';
import { ChangeItem, ComparisonResponse } from './fieldChanges';
import { MessageInfo, Review } from './summaries';

export const ReplyBody = z.object({ reply: z.string().trim().min(1, 'Write the reply').max(4000, 'At most 4,000 characters') }).strict();
export type ReplyBody = z.infer<typeof ReplyBody>;

export const CommentParams = ProjectParams.extend({
  reviewId: z.string().uuid('Not a review id'),
  commentId: z.string().regex(/^[1-9][0-9]{0,17}$/, 'Not a comment id'),
});

/** What changed between the returned revision and the one that answers it (the field-change compare, reused). */
export const RevisionCompare = ComparisonResponse.omit({ fieldChangeId: true, baseRevision: true }).extend({
  returnedRevision: z.object({ id: z.string(), number: z.number().int() }),
  /** one sentence per changed segment or device, changed rows first ("fittings 4× … → 8× …") */
  changes: z.array(ChangeItem),
});
export type RevisionCompare = z.infer<typeof RevisionCompare>;

export const Answers = z.object({
  /** the returned reviews of the previous issued revision, with each comment's reply */
  reviews: z.array(Review),
  compare: RevisionCompare,
});
export type Answers = z.infer<typeof Answers>;
export const AnswersResponse = z.object({ answers: Answers.nullable() });
export type AnswersResponse = z.infer<typeof AnswersResponse>;

export const SendPackageBody = z
  .object({
    /** the systems whose issued revision goes in the package (cold, hot, each zone) */
    systemIds: z.array(z.string().uuid('Not a system id')).min(1, 'Choose at least one system').max(20),
    /** project members with the inspector role */
    inspectorIds: z.array(z.string().uuid('Not a user id')).min(1, 'Choose at least one inspector').max(20),
    message: z.string().trim().max(2000).optional(),
  })
  .strict();
export type SendPackageBody = z.input<typeof SendPackageBody>;
export const SendPackageResponse = z.object({ packageId: z.string(), messages: z.array(MessageInfo), reviews: z.array(Review) });
export type SendPackageResponse = z.infer<typeof SendPackageResponse>;

/** The client path of an accepted review's record. */
export const acceptanceRecordApiPath = (projectId: string, reviewId: string) => `/api/projects/${projectId}/reviews/${reviewId}/acceptance.pdf`;
