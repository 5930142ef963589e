/**
 * Issued summaries, their e-mail, the inspector's reviews and the audit log: request schemas and
 * response shapes shared by the server and the client.
 *
 * Routes (all under /api; "member" = any role in the project; a non-member gets 404):
 *
 *   GET   /projects/:projectId/systems/:systemId/revisions/:revisionId/summary        member    → SummaryResponse
 *   GET   /projects/:projectId/systems/:systemId/revisions/:revisionId/summary.pdf    member    → application/pdf (ETag = "sha256")
 *   POST  /projects/:projectId/systems/:systemId/revisions/:revisionId/summary/retry  designer  → SummaryResponse (only when failed)
 *   POST  /projects/:projectId/systems/:systemId/revisions/:revisionId/summary/send   designer  SendSummaryBody → 202 SendSummaryResponse
 *   GET   /projects/:projectId/systems/:systemId/revisions/:revisionId/messages       designer  → MessagesResponse
 *   POST  /projects/:projectId/messages/:messageId/retry                              designer  → MessageResponse (only when failed)
 *   GET   /projects/:projectId/systems/:systemId/revisions/:revisionId/reviews        member    → ReviewsResponse
 *   GET   /projects/:projectId/reviews                                                member    → ReviewsResponse (the project page)
 *   PATCH /projects/:projectId/reviews/:reviewId                                      the review's inspector  DecideReviewBody → ReviewResponse
 *   (the review loop's own routes — replies, answers, acceptance records — are listed in ./reviewLoop.ts)
 *   GET   /inbox                                                                      signed in → InboxResponse (summaries sent to me)
 *   GET   /projects/:projectId/audit?before=&limit=                                   designer  → AuditResponse
 *   GET   /dev/mail?to=&limit=                       administrator, only with HEADROOM_DEV_MAIL=1 (else 404) → DevMailListResponse
 *   GET   /dev/mail/:mailId                          administrator, dev mail only → DevMailResponse
 *   GET   /dev/mail/:mailId/attachments/:index       administrator, dev mail only → the attachment's bytes
 *
 * A summary is made when a revision is issued: its row is written in the issuing transaction with
 * status "pending", and the PDF is made right after the commit (status "ready", or "failed" with
 * the reason). Poll GET …/summary while it is pending to show progress; GET …/summary.pdf makes a
 * pending PDF on the spot. A ready PDF never changes.
 */
import { z } from 'zod';
import { Email } from './auth';
import { PermitFields, ProjectParams } from './projects';

/** The cautions printed in every summary and shown beside a result (plain words; DESIGN.md "Cautions"). */
export const SUMMARY_CAUTIONS = [
  'Headroom assists a qualified person. It does not replace the adopted plumbing code, the authority having jurisdiction, the manufacturers’ data or a licensed professional’s judgement.',
  'The adopted code and the authority having jurisdiction govern. Where the local code differs from the criteria printed here, the local code applies.',
  'Verify the utility’s pressure, ideally with a current flow test taken in the season of lowest pressure, and verify each device’s loss with the data of the product actually installed.',
  'A change in the field (other fittings, another pipe material or size, another device, an extra offset) voids this check until it is re-run and a new revision is issued.',
  'Where the law requires it, a licensed professional reviews and signs this calculation.',
] as const;

/** What the page header and the signature block print, frozen when the revision is issued. */
export const SummaryHeader = z.object({
  projectName: z.string(),
  address: z.string(),
  codeBasis: z.string(),
  systemName: z.string(),
  revisionNumber: z.number().int(),
  issuedAt: z.string(),
  preparerName: z.string(),
  preparerEmail: z.string(),
  inputHash: z.string(),
  note: z.string().nullable(),
  /** the project's permit fields as they were at issue (absent from headers frozen before they existed) */
  permit: PermitFields.optional(),
});
export type SummaryHeader = z.infer<typeof SummaryHeader>;

export const SUMMARY_STATUSES = ['pending', 'ready', 'failed'] as const;
export const SummaryStatus = z.enum(SUMMARY_STATUSES);

export const SummaryInfo = z.object({
  id: z.string(),
  revisionId: z.string(),
  status: SummaryStatus,
  /** SHA-256 of the PDF bytes (hex), when ready */
  sha256: z.string().nullable(),
  byteLength: z.number().int().nullable(),
  pageCount: z.number().int().nullable(),
  /** milliseconds the server took to make the PDF */
  generationMs: z.number().int().nullable(),
  error: z.string().nullable(),
  createdAt: z.string(),
  readyAt: z.string().nullable(),
  /** API path of the PDF */
  pdfUrl: z.string(),
  fileName: z.string(),
});
export type SummaryInfo = z.infer<typeof SummaryInfo>;
export const SummaryResponse = z.object({ summary: SummaryInfo });
export type SummaryResponse = z.infer<typeof SummaryResponse>;

export const SendSummaryBody = z
  .object({
    /** project members with the inspector role */
    inspectorIds: z.array(z.string().uuid('Not a user id')).max(20).default([]),
    /** outside addresses: each gets an inspector account, membership and an invitation link */
    emails: z.array(Email).max(20).default([]),
    /** a short note from the sender, printed in the e-mail */
    message: z.string().trim().max(2000).optional(),
  })
  .strict()
  .refine((b) => b.inspectorIds.length + b.emails.length > 0, { message: 'Choose at least one recipient', path: ['inspectorIds'] });
export type SendSummaryBody = z.input<typeof SendSummaryBody>;

export const MESSAGE_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const;
export const MessageInfo = z.object({
  id: z.string(),
  kind: z.enum(['summary', 'invitation', 'password-reset', 'field-change', 'review-decision']),
  toAddress: z.string(),
  toName: z.string(),
  recipientUserId: z.string().nullable(),
  subject: z.string(),
  /** queued → sending → sent; or failed (with lastError) after the last attempt */
  status: z.enum(MESSAGE_STATUSES),
  attempts: z.number().int(),
  maxAttempts: z.number().int(),
  nextAttemptAt: z.string().nullable(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
  /** the Message-ID header the message carries (<id@host>) */
  messageId: z.string(),
});
export type MessageInfo = z.infer<typeof MessageInfo>;
export const MessagesResponse = z.object({ messages: z.array(MessageInfo) });
export const MessageResponse = z.object({ message: MessageInfo });
export const MessageParams = ProjectParams.extend({ messageId: z.string().uuid('Not a message id') });

export const REVIEW_STATUSES = ['received', 'accepted', 'returned'] as const;
export const ReviewStatus = z.enum(REVIEW_STATUSES);
export const REVIEW_ITEM_TYPES = ['segment', 'fixture', 'device', 'node', 'input', 'general'] as const;

export const ReviewComment = z.object({
  itemType: z.enum(REVIEW_ITEM_TYPES),
  /** the segment / fixture / device / node id, or a named input such as "source"; null for general */
  itemId: z.string().trim().max(200).nullable().default(null),
  comment: z.string().trim().min(1, 'Write the comment').max(4000),
});
export type ReviewComment = z.infer<typeof ReviewComment>;

export const DecideReviewBody = z
  .object({
    decision: z.enum(['accepted', 'returned']),
    comment: z.string().trim().max(8000).default(''),
    items: z.array(ReviewComment).max(200).default([]),
    version: z.number().int().min(1),
  })
  .strict()
  .refine((b) => b.decision === 'accepted' || b.comment.length > 0 || b.items.length > 0, {
    message: 'Say why it is returned: a comment or at least one item',
    path: ['comment'],
  });
export type DecideReviewBody = z.input<typeof DecideReviewBody>;

export const ReviewParams = ProjectParams.extend({ reviewId: z.string().uuid('Not a review id') });

export const ReviewReply = z.object({ text: z.string(), by: z.string().nullable(), at: z.string() });
export type ReviewReply = z.infer<typeof ReviewReply>;

export const Review = z.object({
  id: z.string(),
  projectId: z.string(),
  systemId: z.string(),
  systemName: z.string(),
  revisionId: z.string(),
  revisionNumber: z.number().int(),
  revisionStatus: z.enum(['draft', 'issued', 'superseded']),
  reviewer: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  sentBy: z.string().nullable(),
  status: ReviewStatus,
  comment: z.string(),
  items: z.array(
    z.object({
      /** the comment's id (the designer's reply is put at …/comments/:commentId/reply) */
      id: z.string().default(''),
      itemType: z.enum(REVIEW_ITEM_TYPES),
      itemId: z.string().nullable(),
      comment: z.string(),
      /** the designer's answer; frozen once the next revision is issued */
      reply: ReviewReply.nullable().default(null),
    }),
  ),
  version: z.number().int(),
  receivedAt: z.string(),
  decidedAt: z.string().nullable(),
  /** the revision issued after this review was returned (it answers the comments; the replies are frozen) */
  answeredIn: z.object({ revisionId: z.string(), revisionNumber: z.number().int() }).nullable().default(null),
  /** the building's submission this review is part of (one review per system), when it was sent as one */
  packageId: z.string().nullable().default(null),
  /** the printable record of an accepted review */
  acceptanceRecord: z.object({ url: z.string(), fileName: z.string(), sha256: z.string(), createdAt: z.string() }).nullable().default(null),
});
export type Review = z.infer<typeof Review>;
export const ReviewsResponse = z.object({ reviews: z.array(Review) });
export const ReviewResponse = z.object({ review: Review });

export const SendSummaryResponse = z.object({ messages: z.array(MessageInfo), reviews: z.array(Review) });
export type SendSummaryResponse = z.infer<typeof SendSummaryResponse>;

export const InboxItem = z.object({
  review: Review,
  project: z.object({ id: z.string(), name: z.string(), address: z.string() }),
  summary: SummaryInfo.nullable(),
  /** client path of the read-only view */
  viewPath: z.string(),
});
export type InboxItem = z.infer<typeof InboxItem>;
export const InboxResponse = z.object({ items: z.array(InboxItem) });

export const AuditQuery = z.object({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
});
export const AuditEntry = z.object({
  id: z.number().int(),
  at: z.string(),
  actor: z.object({ id: z.string(), name: z.string() }).nullable(),
  action: z.string(),
  subjectType: z.string(),
  subjectId: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
});
export type AuditEntry = z.infer<typeof AuditEntry>;
/** newest first; pass nextBefore as ?before= for the next page (null at the end) */
export const AuditResponse = z.object({ entries: z.array(AuditEntry), nextBefore: z.number().int().nullable() });

/** ?to= keeps the messages sent to that address; newest first */
export const DevMailListQuery = z.object({
  to: z.string().trim().toLowerCase().max(254).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
});
export const DevMailParams = z.object({ mailId: z.coerce.number().int().positive() });
export const DevMailAttachmentParams = DevMailParams.extend({ index: z.coerce.number().int().min(0) });
export const DevMailAttachment = z.object({
  index: z.number().int(),
  filename: z.string(),
  contentType: z.string(),
  size: z.number().int(),
  sha256: z.string(),
  url: z.string(),
});
export const DevMail = z.object({
  id: z.number().int(),
  receivedAt: z.string(),
  envelopeFrom: z.string(),
  envelopeTo: z.array(z.string()),
  messageId: z.string().nullable(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  attachments: z.array(DevMailAttachment),
});
export type DevMail = z.infer<typeof DevMail>;
export const DevMailListResponse = z.object({ messages: z.array(DevMail) });

/** The client path of a revision's read-only result view (also linked from the e-mail). */
export const resultViewPath = (projectId: string, systemId: string, revisionId: string) =>
  `/projects/${projectId}/systems/${systemId}/revisions/${revisionId}/result`;
