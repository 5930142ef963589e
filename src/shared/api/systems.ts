import { z } from 'zod';
import { SystemDocumentSchema } from '../../engine/model/schema';
import type { Analysis } from '../../engine/analysis/types';
import type { EngineInputErrorJSON } from '../../engine/errors';
import { ProjectParams } from './projects';

export const SERVICES = ['cold', 'hot'] as const;
export const REVISION_STATUSES = ['draft', 'issued', 'superseded'] as const;
export const RevisionStatus = z.enum(REVISION_STATUSES);
export type RevisionStatus = z.infer<typeof RevisionStatus>;

export const CreateSystemBody = z
  .object({
    name: z.string().trim().min(1, 'Enter a system name').max(160),
    service: z.enum(SERVICES),
    /** °F or °C in the project's unit system; default 60 °F / 15.6 °C cold, 140 °F / 60 °C hot */
    waterTemperature: z.number().min(-10, 'Too cold for liquid water in a building').max(212, 'Too hot').optional(),
    /** a whole system document (JSON import); otherwise a starter document is made */
    document: z.unknown().optional(),
  })
  .strict();
export type CreateSystemBody = z.infer<typeof CreateSystemBody>;

export const SaveDocumentBody = z.object({ document: SystemDocumentSchema, version: z.number().int().min(1) }).strict();
/** Shortest acknowledgement of a failing verdict the server records: a sentence, not a click-through. */
export const FAILURE_ACKNOWLEDGEMENT_MIN_LENGTH = 20;

/**
 * The preparer's attestation at issue: the statement they confirm, in Headroom's plain words, with
 * their name and licence or registration number as they confirm them. Recorded with the time on
 * the revision, printed in its summary beside an empty signature field for their own certificate.
 */
export const ATTESTATION_STATEMENTS = {
  prepared: 'I prepared this calculation and checked its inputs, method and results.',
  supervised: 'This calculation was prepared under my direct supervision, and I checked its inputs, method and results.',
} as const;
export const ATTESTATION_BASES = ['prepared', 'supervised'] as const;
export const Attestation = z
  .object({
    name: z.string().trim().min(1, 'Enter your name as it appears on your licence').max(160),
    licenceNumber: z.string().trim().min(1, 'Enter your licence or registration number').max(80, 'At most 80 characters'),
    basis: z.enum(ATTESTATION_BASES),
    confirmed: z.literal(true, { message: 'Confirm the statement to issue' }),
  })
  .strict();
export type Attestation = z.infer<typeof Attestation>;
/** The attestation as recorded: the statement's words, who confirmed it and when. */
export const AttestationRecord = z.object({ name: z.string(), licenceNumber: z.string(), statement: z.string(), by: z.string().nullable(), at: z.string() });
export type AttestationRecord = z.infer<typeof AttestationRecord>;

/**
 * Issuing a draft. The server refuses a draft whose analysis is incomplete (409 REVISION_INCOMPLETE
 * with the reasons) and a failing one unless `acknowledgeFailure` carries the designer's own
 * statement of why it is issued although it fails (409 FAILURE_NOT_ACKNOWLEDGED); the statement is
 * recorded on the revision, printed in its summary and kept in the audit log. Every issue carries the
 * preparer's attestation (a summary goes to a plan reviewer as a permit document).
 */
export const IssueBody = z
  .object({
    version: z.number().int().min(1),
    note: z.string().max(2000).optional(),
    attestation: Attestation,
    acknowledgeFailure: z
      .object({
        statement: z
          .string()
          .trim()
          .min(
            FAILURE_ACKNOWLEDGEMENT_MIN_LENGTH,
            `In your own words (at least ${FAILURE_ACKNOWLEDGEMENT_MIN_LENGTH} characters), say why this revision is issued although it fails`,
          )
          .max(2000),
      })
      .strict()
      .optional(),
  })
  .strict();
export type IssueBody = z.infer<typeof IssueBody>;
export const NewDraftBody = z.object({ fromRevisionId: z.string().uuid('Not a revision id') }).strict();

export const SystemParams = ProjectParams.extend({ systemId: z.string().uuid('Not a system id') });
export const RevisionParams = SystemParams.extend({ revisionId: z.string().uuid('Not a revision id') });
export const CompareQuery = z.object({ a: z.string().uuid('Not a revision id'), b: z.string().uuid('Not a revision id') });

/** The verdict of a revision in a few numbers, for lists. */
export const RevisionVerdict = z.object({
  ok: z.boolean(),
  /** pass / fail / incomplete; null when the document could not be analysed. */
  status: z.enum(['pass', 'fail', 'incomplete']).nullable(),
  /** True only when status is 'pass'. */
  allPass: z.boolean().nullable(),
  criticalFixtureId: z.string().nullable(),
  criticalMargin: z.number().nullable(),
  warningCount: z.number().int(),
  errorMessage: z.string().nullable(),
});
export type RevisionVerdict = z.infer<typeof RevisionVerdict>;

/** The designer's acknowledgement that a revision was issued although it fails. */
export const FailureAcknowledgement = z.object({ statement: z.string(), by: z.string().nullable(), at: z.string() });
export type FailureAcknowledgement = z.infer<typeof FailureAcknowledgement>;

export const RevisionSummary = z.object({
  id: z.string(),
  number: z.number().int(),
  status: RevisionStatus,
  version: z.number().int(),
  updatedAt: z.string(),
  issuedAt: z.string().nullable(),
  issuedBy: z.string().nullable(),
  inputHash: z.string().nullable(),
  verdict: RevisionVerdict,
  /** set only on a failing revision issued with the designer's acknowledgement */
  failureAcknowledgement: FailureAcknowledgement.nullable().optional(),
  /** the preparer's attestation recorded at issue (null for a draft and for revisions issued before attestations) */
  attestation: AttestationRecord.nullable().optional(),
});
export type RevisionSummary = z.infer<typeof RevisionSummary>;

/** The accepted field change a revision was made from: its history, as frozen at acceptance. */
export const RevisionOrigin = z.object({
  fieldChangeId: z.string(),
  number: z.number().int(),
  title: z.string(),
  baseRevisionNumber: z.number().int(),
  proposedBy: z.string(),
  proposedAt: z.string(),
  acceptedBy: z.string(),
  acceptedAt: z.string(),
  comment: z.string().nullable(),
  /** one sentence per changed segment or device */
  changes: z.array(z.string()),
});
export type RevisionOrigin = z.infer<typeof RevisionOrigin>;

/**
 * What the engine made of a revision's document: its analysis, or the input error that stopped it.
 * The server stores it compactly (server/services/storedAnalysis.ts) and answers it whole, with every
 * display value; an issued revision's numbers are the ones it was issued with.
 */
export type AnalysisOutcome = { ok: true; analysis: Analysis } | { ok: false; error: EngineInputErrorJSON };
/** Checked only for its shape's root: the server builds it from the engine's own types. */
export const AnalysisOutcome = z.custom<AnalysisOutcome>(
  (v) =>
    typeof v === 'object' &&
    v !== null &&
    ((v as { ok?: unknown }).ok === true ? typeof (v as { analysis?: unknown }).analysis === 'object' : typeof (v as { error?: unknown }).error === 'object'),
  'Not an analysis outcome',
);

export const Revision = RevisionSummary.extend({
  document: z.unknown(),
  /** the engine's analysis computed by the server when the revision was last saved (a draft) or issued */
  analysis: AnalysisOutcome,
  /** the engine version that analysis was made with (an issued revision keeps its own) */
  engineVersion: z.string(),
  note: z.string().nullable(),
  /** set when the revision came from an accepted field change */
  origin: RevisionOrigin.nullable().default(null),
});
export type Revision = z.infer<typeof Revision>;

/**
 * "Returned to you": the newest review of the system's issued revision is Returned and no newer
 * revision has been issued. Cleared by issuing the next revision.
 */
export const ReturnedMarker = z.object({
  reviewId: z.string(),
  revisionId: z.string(),
  revisionNumber: z.number().int(),
  reviewerName: z.string(),
  decidedAt: z.string(),
  /** comments on the review (overall and per item) and how many the designer has answered */
  comments: z.number().int(),
  answered: z.number().int(),
});
export type ReturnedMarker = z.infer<typeof ReturnedMarker>;

export const SystemInfo = z.object({
  id: z.string(),
  projectId: z.string(),
  name: z.string(),
  service: z.enum(SERVICES),
  createdAt: z.string(),
  latest: RevisionSummary.nullable(),
  returned: ReturnedMarker.nullable().default(null),
});
export type SystemInfo = z.infer<typeof SystemInfo>;

export const SystemListResponse = z.object({ systems: z.array(SystemInfo) });
export const SystemDetailResponse = z.object({ system: SystemInfo, revisions: z.array(RevisionSummary) });
export const RevisionResponse = z.object({ revision: Revision });
/**
 * The answer to a draft save: the revision's summary (its new version, its verdict with the count of
 * warnings) and nothing more. The client has run the engine on the same document itself; the stored
 * analysis is read through the revision's GET by whoever needs it.
 */
export const SaveDocumentResponse = z.object({ revision: RevisionSummary });
export type SaveDocumentResponse = z.infer<typeof SaveDocumentResponse>;
export const CreateSystemResponse = z.object({ system: SystemInfo, revision: Revision });

export const CompareResponse = z.object({
  a: RevisionSummary,
  b: RevisionSummary,
  fixtures: z.array(
    z.object({
      id: z.string(),
      label: z.string(),
      marginA: z.number().nullable(),
      marginB: z.number().nullable(),
      delta: z.number().nullable(),
      passA: z.boolean().nullable(),
      passB: z.boolean().nullable(),
    }),
  ),
  segments: z.array(z.object({ id: z.string(), change: z.enum(['added', 'removed', 'changed']), fields: z.array(z.string()) })),
  pressureUnit: z.string(),
});
export type CompareResponse = z.infer<typeof CompareResponse>;

/** The result tables a revision exports for the engineer's report (GET …/export/:table.csv, …/export.xlsx). */
export const ExportTableParams = RevisionParams.extend({
  table: z.enum(['segments', 'fixtures', 'ledgers'], { error: 'Choose segments, fixtures or ledgers' }),
});
