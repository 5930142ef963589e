/**
 * Field changes: a contractor's proposed substitution on an issued revision (other fittings, pipe
 * material or size, an extra offset, another device), checked side by side against the issued
 * design, with product data and photos attached, and accepted or declined by the designer.
 * Request schemas and response shapes shared by the server and the client.
 *
 * Routes (all under /api; "member" = any role in the project; a non-member gets 404; every write
 * needs the x-csrf-token header, uploads included). FC = /projects/:projectId/systems/:systemId/field-changes
 *
 *   GET    /projects/:projectId/field-changes?status=                  member      → FieldChangeListResponse (the project's, newest first)
 *   GET    FC                                                          member      → FieldChangeListResponse (the system's)
 *   POST   FC                                                          contractor  CreateFieldChangeBody → 201 FieldChangeResponse
 *   GET    FC/:fieldChangeId                                           member      → FieldChangeResponse (with document, analysis, attachments)
 *   PATCH  FC/:fieldChangeId                                           its author, draft only  UpdateFieldChangeBody → FieldChangeResponse
 *   GET    FC/:fieldChangeId/comparison                                member      → ComparisonResponse (the side by side)
 *   POST   FC/:fieldChangeId/propose                                   its author, draft only  VersionBody → FieldChangeResponse
 *   POST   FC/:fieldChangeId/accept                                    designer, proposed only  AcceptFieldChangeBody → AcceptFieldChangeResponse
 *   POST   FC/:fieldChangeId/decline                                   designer, proposed only  DeclineFieldChangeBody → FieldChangeResponse
 *   POST   FC/:fieldChangeId/attachments                               its author, draft or proposed; multipart/form-data, one file in the field "file" → 201 AttachmentResponse
 *   GET    FC/:fieldChangeId/attachments/:attachmentId                 member      → the bytes (Content-Disposition: attachment; nosniff)
 *   DELETE FC/:fieldChangeId/attachments/:attachmentId                 its author, draft only → 204
 *
 * States: draft → proposed (each designer of the project gets an e-mail) → accepted (a new DRAFT
 * revision of the system is made from the field change's document, for the designer to issue — or,
 * when the system has a draft already, the changes are carried onto it; the revision records the
 * field change) or declined (with a reason). The author is e-mailed either way.
 * Every write of a field change takes its `version` (409 STALE_VERSION when someone changed it).
 *
 * What a contractor may change (the server compares the document with the issued one and refuses
 * anything else with 403 FORBIDDEN, `fields` naming every difference):
 *   - per existing segment: material, size, custom pipe data, length (an extra offset adds pipe)
 *     and fittings;
 *   - devices: change, add or remove (another meter, backflow preventer or PRV).
 * Everything else stays as issued: the source (supply), the criteria, the nodes with their
 * elevations, fixture groups and checked fixtures, the segments' from/to, rise, label, design-flow
 * override and size-change setting, the water temperature, the name and notes. No segment or node
 * is added or removed.
 *
 * Errors a client should expect: 403 FORBIDDEN with fields (a part that stays as issued), 409
 * CONFLICT (out-of-order state change; the base revision is no longer the current issued one;
 * accepting onto a draft that changed the same fields differently — `fields` names them), 409 STALE_VERSION, 400 VALIDATION_FAILED (the document breaks
 * the format; an upload that is not a PDF/JPEG/PNG by its content; an empty file), 413 (an upload
 * over the size limit, 10 MB by default).
 */
import { z } from 'zod';
import { SystemDocumentSchema } from '../../engine/model/schema';
import { ProjectParams } from './projects';
import { SystemParams } from './systems';

export const FIELD_CHANGE_STATUSES = ['draft', 'proposed', 'accepted', 'declined'] as const;
export const FieldChangeStatus = z.enum(FIELD_CHANGE_STATUSES);
export type FieldChangeStatus = z.infer<typeof FieldChangeStatus>;

/** The detected types an attachment may have (by content: %PDF-, FF D8 FF, the PNG signature). */
export const ATTACHMENT_TYPES = ['application/pdf', 'image/jpeg', 'image/png'] as const;
export const AttachmentType = z.enum(ATTACHMENT_TYPES);
/** The default upload limit: 10 MiB, a choice (a scanned data sheet or a phone photo fits). */
export const DEFAULT_UPLOAD_MAX_BYTES = 10 * 1024 * 1024;
/** The multipart field that carries the file. */
export const UPLOAD_FIELD = 'file';

export const FieldChangeParams = SystemParams.extend({ fieldChangeId: z.string().uuid('Not a field change id') });
export const AttachmentParams = FieldChangeParams.extend({ attachmentId: z.string().uuid('Not an attachment id') });
export const ProjectFieldChangesQuery = z.object({ status: FieldChangeStatus.optional() });
export { ProjectParams };

export const CreateFieldChangeBody = z
  .object({
    /** must be the system's current issued revision */
    revisionId: z.string().uuid('Not a revision id'),
    title: z.string().trim().min(1, 'Say in a few words what is substituted').max(200),
    description: z.string().trim().max(8000).default(''),
  })
  .strict();
export type CreateFieldChangeBody = z.input<typeof CreateFieldChangeBody>;

export const UpdateFieldChangeBody = z
  .object({
    title: z.string().trim().min(1, 'Say in a few words what is substituted').max(200).optional(),
    description: z.string().trim().max(8000).optional(),
    /** the whole document; only the allowed parts may differ from the issued revision */
    document: SystemDocumentSchema.optional(),
    version: z.number().int().min(1),
  })
  .strict();
export type UpdateFieldChangeBody = z.input<typeof UpdateFieldChangeBody>;

export const VersionBody = z.object({ version: z.number().int().min(1) }).strict();
export const AcceptFieldChangeBody = z.object({ version: z.number().int().min(1), comment: z.string().trim().max(4000).optional() }).strict();
export const DeclineFieldChangeBody = z
  .object({ version: z.number().int().min(1), reason: z.string().trim().min(1, 'Say why the field change is declined').max(4000) })
  .strict();
export type DeclineFieldChangeBody = z.input<typeof DeclineFieldChangeBody>;

const Person = z.object({ id: z.string(), name: z.string(), email: z.string() });

/** One changed thing, in words: before and after as the summary prints them (null = absent). */
export const ChangeField = z.object({ field: z.string(), before: z.string().nullable(), after: z.string().nullable() });
export type ChangeField = z.infer<typeof ChangeField>;
export const ChangeItem = z.object({
  elementType: z.enum(['segment', 'device']),
  elementId: z.string(),
  label: z.string(),
  change: z.enum(['changed', 'added', 'removed']),
  fields: z.array(ChangeField),
  /** one sentence: "Segment Riser: material Copper tube, Type L → PEX tubing, SDR 9; size 3/4 → 1" */
  text: z.string(),
});
export type ChangeItem = z.infer<typeof ChangeItem>;

/** What an issued summary prints about the field change a revision came from (frozen at acceptance). */
export const FieldChangeRecord = z.object({
  fieldChangeId: z.string(),
  number: z.number().int(),
  title: z.string(),
  baseRevisionNumber: z.number().int(),
  proposedBy: Person,
  proposedAt: z.string(),
  acceptedBy: Person,
  acceptedAt: z.string(),
  comment: z.string().nullable(),
  changes: z.array(ChangeItem),
});
export type FieldChangeRecord = z.infer<typeof FieldChangeRecord>;

export const Attachment = z.object({
  id: z.string(),
  fileName: z.string(),
  contentType: AttachmentType,
  byteLength: z.number().int(),
  sha256: z.string(),
  uploadedBy: Person,
  createdAt: z.string(),
  /** API path of the bytes */
  url: z.string(),
});
export type Attachment = z.infer<typeof Attachment>;
export const AttachmentResponse = z.object({ attachment: Attachment });

export const FieldChangeSummary = z.object({
  id: z.string(),
  projectId: z.string(),
  systemId: z.string(),
  systemName: z.string(),
  number: z.number().int(),
  title: z.string(),
  description: z.string(),
  status: FieldChangeStatus,
  version: z.number().int(),
  baseRevision: z.object({ id: z.string(), number: z.number().int(), status: z.enum(['draft', 'issued', 'superseded']) }),
  /** true while the base revision is the system's current issued one (only then can it be accepted) */
  baseIsCurrent: z.boolean(),
  createdBy: Person,
  createdAt: z.string(),
  updatedAt: z.string(),
  proposedAt: z.string().nullable(),
  decidedBy: Person.nullable(),
  decidedAt: z.string().nullable(),
  declineReason: z.string().nullable(),
  /** the draft revision made on acceptance */
  acceptedRevision: z.object({ id: z.string(), number: z.number().int() }).nullable(),
  /** the differences from the issued revision so far */
  changes: z.array(ChangeItem),
  attachmentCount: z.number().int(),
});
export type FieldChangeSummary = z.infer<typeof FieldChangeSummary>;

export const FieldChange = FieldChangeSummary.extend({
  /** the contractor's copy of the system document (SystemDocumentSchema) */
  document: z.unknown(),
  /** the engine's analysis of it ({ ok: true, analysis } or { ok: false, error }) computed by the server */
  analysis: z.unknown(),
  attachments: z.array(Attachment),
});
export type FieldChange = z.infer<typeof FieldChange>;
export const FieldChangeResponse = z.object({ fieldChange: FieldChange });
export const FieldChangeListResponse = z.object({ fieldChanges: z.array(FieldChangeSummary) });
export const AcceptFieldChangeResponse = z.object({
  fieldChange: FieldChange,
  /** the new draft revision (src/shared/api/systems.ts Revision) */
  revision: z.object({ id: z.string(), number: z.number().int(), status: z.literal('draft'), version: z.number().int() }).passthrough(),
});

const SideResult = z.object({ ok: z.boolean(), error: z.string().nullable() });
/**
 * The side by side: two independent engine runs (the issued document and the field change's),
 * every number in the document's unit system (`units`). Losses are friction + fittings of the
 * segment alone (not devices, not rise); differences are new − issued.
 */
export const ComparisonResponse = z.object({
  fieldChangeId: z.string(),
  baseRevision: z.object({ id: z.string(), number: z.number().int() }),
  units: z.object({ pressure: z.string(), velocity: z.string(), length: z.string(), flow: z.string() }),
  issued: SideResult,
  proposed: SideResult,
  verdict: z.object({
    /** every fixture, velocity and static check met with the change */
    pass: z.boolean().nullable(),
    /** "Still passes; the smallest margin falls from 12.40 psi to 9.85 psi at Lavatory, level 2." / "Fails at … by 2.10 psi." */
    sentence: z.string(),
    criticalFixtureId: z.string().nullable(),
    issuedSmallestMargin: z.number().nullable(),
    newSmallestMargin: z.number().nullable(),
  }),
  fixtures: z.array(
    z.object({
      id: z.string(),
      label: z.string(),
      nodeId: z.string(),
      required: z.number().nullable(),
      issuedResidual: z.number().nullable(),
      newResidual: z.number().nullable(),
      issuedMargin: z.number().nullable(),
      newMargin: z.number().nullable(),
      difference: z.number().nullable(),
      issuedPass: z.boolean().nullable(),
      newPass: z.boolean().nullable(),
    }),
  ),
  segments: z.array(
    z.object({
      id: z.string(),
      label: z.string(),
      changes: z.array(ChangeField),
      issued: z
        .object({
          frictionLoss: z.number(),
          fittingLoss: z.number(),
          loss: z.number(),
          velocity: z.number(),
          velocityPass: z.boolean().nullable(),
          designFlow: z.number(),
        })
        .nullable(),
      proposed: z
        .object({
          frictionLoss: z.number(),
          fittingLoss: z.number(),
          loss: z.number(),
          velocity: z.number(),
          velocityPass: z.boolean().nullable(),
          designFlow: z.number(),
        })
        .nullable(),
      lossDifference: z.number().nullable(),
      velocityDifference: z.number().nullable(),
    }),
  ),
  devices: z.array(
    z.object({
      id: z.string(),
      label: z.string(),
      change: z.enum(['changed', 'added', 'removed']),
      changes: z.array(ChangeField),
      issuedLoss: z.number().nullable(),
      newLoss: z.number().nullable(),
      lossDifference: z.number().nullable(),
    }),
  ),
  /** warnings of the new run whose code + element the issued run does not have */
  newWarnings: z.array(
    z.object({
      code: z.string(),
      severity: z.string(),
      message: z.string(),
      elementType: z.string(),
      elementId: z.string().nullable(),
      detail: z.string().nullable(),
    }),
  ),
  /** warnings of the issued run that the change removes */
  resolvedWarnings: z.array(
    z.object({
      code: z.string(),
      severity: z.string(),
      message: z.string(),
      elementType: z.string(),
      elementId: z.string().nullable(),
      detail: z.string().nullable(),
    }),
  ),
});
export type ComparisonResponse = z.infer<typeof ComparisonResponse>;

/** The client path of a field change's page (linked from the e-mails). */
export const fieldChangeViewPath = (projectId: string, systemId: string, fieldChangeId: string) =>
  `/projects/${projectId}/systems/${systemId}/field-changes/${fieldChangeId}`;
/** The API path of a system's field changes. */
export const fieldChangesApiPath = (projectId: string, systemId: string) => `/api/projects/${projectId}/systems/${systemId}/field-changes`;
