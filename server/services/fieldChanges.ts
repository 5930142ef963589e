/**
 * Field changes: a contractor's copy of the current issued revision in which they change fittings,
 * pipe (material, size, custom data, length) and devices; proposed to the project's designers,
 * who accept it (→ a new draft revision made from its document, recording the field change) or
 * decline it with a reason. Every step is audited; every e-mail goes through the outbox in the
 * same transaction as the step.
 */
import { ENGINE_VERSION, SystemDocumentSchema, type SystemDocument } from '../../src/engine';
import { ServiceError, conflict, notFound, staleVersion } from './errors';
import { systemsRepo, revisionsRepo, type RevisionRow } from '../repositories/systems';
import { fieldChangesRepo, type FieldChangeListRow, type FieldChangeRow } from '../repositories/fieldChanges';
import { attachmentsRepo } from '../repositories/attachments';
import { auditRepo } from '../repositories/audit';
import { locks } from '../repositories/locks';
import { usersRepo } from '../repositories/users';
import { projectsRepo } from '../repositories/projects';
import { iso, type Tx } from '../db/rows';
import { analyse, systemsService } from './systems';
import { toAttachment } from './attachments';
import { describeChanges, forbiddenDifferences } from './fieldChangeRules';
import { compareDocuments } from './fieldChangeComparison';
import { mergeFieldChange } from './fieldChangeMerge';
import { fieldChangeDecidedMessage, fieldChangeProposedMessage } from '../mail/messages';
import type { Actor, ServiceContext } from './context';
import { runTransition } from './fieldChangeWorkflow';
import {
  fieldChangeViewPath,
  type ComparisonResponse,
  type CreateFieldChangeBody,
  type FieldChange,
  type FieldChangeRecord,
  type FieldChangeStatus,
  type FieldChangeSummary,
} from '../../src/shared/api/fieldChanges';

const doc = (value: unknown): SystemDocument => SystemDocumentSchema.parse(value);

function present(row: FieldChangeListRow & { base_document: unknown }): FieldChangeSummary {
  return {
    id: row.id,
    projectId: row.project_id,
    systemId: row.system_id,
    systemName: row.system_name,
    number: row.number,
    title: row.title,
    description: row.description,
    status: row.status,
    version: row.version,
    baseRevision: { id: row.base_revision_id, number: row.base_number, status: row.base_status },
    baseIsCurrent: row.base_status === 'issued',
    createdBy: { id: row.created_by, name: row.author_name, email: row.author_email },
    createdAt: iso(row.created_at),
    updatedAt: iso(row.updated_at),
    proposedAt: row.proposed_at ? iso(row.proposed_at) : null,
    decidedBy: row.decided_by ? { id: row.decided_by, name: row.decider_name ?? '', email: row.decider_email ?? '' } : null,
    decidedAt: row.decided_at ? iso(row.decided_at) : null,
    declineReason: row.decline_reason,
    acceptedRevision: row.accepted_revision_id && row.accepted_number !== null ? { id: row.accepted_revision_id, number: row.accepted_number } : null,
    changes: describeChanges(doc(row.base_document), doc(row.document)),
    attachmentCount: Number(row.attachment_count),
  };
}

/** The base revision must still be the system's current issued one. */
function requireCurrent(base: RevisionRow | undefined, row: FieldChangeRow, current: RevisionRow | undefined, doing: string) {
  if (base?.status === 'issued') return;
  const now = current ? `revision ${current.number} is` : 'no revision is';
  throw conflict(
    `Field change ${row.number} was made on revision ${base?.number ?? '?'}, which is no longer the current issued revision (${now}). It cannot be ${doing}; start a new field change on the current issued revision.`,
  );
}

async function mailContext(ctx: ServiceContext, trx: Tx, row: FieldChangeRow) {
  const [project, system, base] = await Promise.all([
    projectsRepo.findById(trx, row.project_id),
    systemsRepo.find(trx, row.project_id, row.system_id),
    revisionsRepo.find(trx, row.system_id, row.base_revision_id),
  ]);
  return {
    projectName: project?.name ?? '',
    systemName: system?.name ?? '',
    baseRevisionNumber: base?.number ?? 0,
    viewUrl: `${ctx.config.PUBLIC_URL.replace(/\/$/, '')}${fieldChangeViewPath(row.project_id, row.system_id, row.id)}`,
    base,
  };
}

export const fieldChangesService = {
  async listForSystem(ctx: ServiceContext, projectId: string, systemId: string): Promise<FieldChangeSummary[]> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    return (await fieldChangesRepo.listForSystem(ctx.db, projectId, systemId)).map(present);
  },

  async listForProject(ctx: ServiceContext, projectId: string, status?: FieldChangeStatus): Promise<FieldChangeSummary[]> {
    return (await fieldChangesRepo.listForProject(ctx.db, projectId, status)).map(present);
  },

  async get(ctx: ServiceContext | { db: Tx }, projectId: string, systemId: string, id: string): Promise<FieldChange> {
    const row = await fieldChangesRepo.find(ctx.db, projectId, systemId, id);
    if (!row) throw notFound('The field change');
    const attachments = await attachmentsRepo.listForFieldChange(ctx.db, id);
    return { ...present(row), document: row.document, analysis: row.analysis, attachments: attachments.map((a) => toAttachment(a, row.system_id)) };
  },

  async create(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, body: CreateFieldChangeBody): Promise<FieldChange> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const id = await ctx.db.transaction(async (trx) => {
      await locks.system(trx, systemId);
      const base = await revisionsRepo.find(trx, systemId, body.revisionId);
      if (!base) throw notFound('The revision');
      if (base.status !== 'issued') {
        const current = await fieldChangesRepo.currentIssued(trx, systemId);
        throw conflict(
          `Revision ${base.number} is ${base.status === 'draft' ? 'a draft' : 'superseded'}; a field change starts on the current issued revision${current ? ` (revision ${current.number})` : ', and this system has none yet'}.`,
        );
      }
      const document = doc(base.document);
      const number = await fieldChangesRepo.nextNumber(trx, systemId);
      const row = await fieldChangesRepo.insert(trx, {
        project_id: projectId,
        system_id: systemId,
        base_revision_id: base.id,
        number,
        title: body.title,
        description: body.description ?? '',
        document,
        analysis: analyse(document),
        engine_version: ENGINE_VERSION,
        created_by: actor.id,
      });
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'field-change.created',
        subjectType: 'field-change',
        subjectId: row.id,
        details: { number, title: body.title, baseRevision: base.number },
      });
      return row.id;
    });
    return this.get(ctx, projectId, systemId, id);
  },

  /** Saves a draft's title, description and document; a document may differ from the issued one only where a field change may. */
  async update(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    systemId: string,
    id: string,
    body: { title?: string; description?: string; document?: SystemDocument; version: number },
  ): Promise<FieldChange> {
    await runTransition(ctx, actor, { projectId, systemId, id, version: body.version, action: 'save' }, async (trx, row) => {
      let analysis: unknown;
      if (body.document) {
        const base = await revisionsRepo.find(trx, systemId, row.base_revision_id);
        const fields = forbiddenDifferences(doc(base!.document), body.document);
        const paths = Object.keys(fields);
        if (paths.length) {
          throw new ServiceError(
            'FORBIDDEN',
            `A field change may change only the segments' material, size, custom pipe data, length and fittings, and the devices. These stay as issued: ${paths
              .slice(0, 8)
              .map((p) => p.replace(/^document\./, ''))
              .join(', ')}${paths.length > 8 ? ` and ${paths.length - 8} more` : ''}.`,
            fields,
          );
        }
        analysis = analyse(body.document);
      }
      return {
        set: {
          title: body.title,
          description: body.description,
          document: body.document,
          analysis,
          engine_version: body.document ? ENGINE_VERSION : undefined,
        },
        details: { document: !!body.document, ...(body.title !== undefined ? { title: body.title } : {}) },
        result: undefined,
      };
    });
    return this.get(ctx, projectId, systemId, id);
  },

  async propose(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, id: string, version: number): Promise<FieldChange> {
    await runTransition(ctx, actor, { projectId, systemId, id, version, action: 'propose' }, async (trx, row) => {
      const m = await mailContext(ctx, trx, row);
      requireCurrent(m.base, row, await fieldChangesRepo.currentIssued(trx, systemId), 'proposed');
      const issuedDoc = doc(m.base!.document);
      const proposedDoc = doc(row.document);
      const changes = describeChanges(issuedDoc, proposedDoc);
      if (!changes.length) throw conflict('The field change is the same as the issued revision; change something before proposing it.');
      const stored = row.analysis as { ok: boolean; error?: { message: string } };
      if (!stored.ok) throw conflict(`The field change cannot be computed, so it cannot be proposed: ${stored.error?.message ?? 'unknown reason'}`);
      const [designers, contractor] = await Promise.all([fieldChangesRepo.designers(trx, projectId), usersRepo.findById(trx, actor.id)]);
      const verdict = compareDocuments(issuedDoc, proposedDoc, changes).verdict.sentence;
      return {
        set: { proposed_at: trx.fn.now() },
        details: { to: designers.map((d) => d.email), changes: changes.map((c) => c.text) },
        message: (to) =>
          fieldChangeProposedMessage({
            ...m,
            recipientName: to.name,
            contractorName: contractor?.name ?? 'A contractor',
            number: row.number,
            title: row.title,
            description: row.description,
            changes: changes.map((c) => c.text),
            verdict,
          }),
        result: undefined,
      };
    });
    return this.get(ctx, projectId, systemId, id);
  },

  /**
   * Accepting makes a new draft revision from the field change's document, exactly; when the system
   * has a draft already, the field change's changes are carried onto that draft (fieldChangeMerge.ts).
   */
  async accept(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, id: string, version: number, comment: string | null) {
    const revisionId = await runTransition(ctx, actor, { projectId, systemId, id, version, action: 'accept' }, async (trx, row) => {
      const m = await mailContext(ctx, trx, row);
      requireCurrent(m.base, row, await fieldChangesRepo.currentIssued(trx, systemId), 'accepted');
      const [contractor, designer] = await Promise.all([usersRepo.findById(trx, row.created_by), usersRepo.findById(trx, actor.id)]);
      const existing = await revisionsRepo.draftOf(trx, systemId);
      let revision: { id: string; number: number };
      if (existing) {
        // A system has one draft at a time: the contractor's changes are carried onto the designer's
        // draft, unless the designer changed the same thing differently (then nothing is merged).
        const merged = mergeFieldChange(doc(m.base!.document), doc(row.document), doc(existing.document));
        if (Object.keys(merged.conflicts).length) {
          throw conflict(
            `Revision ${existing.number} is a draft that changes some of the same things as field change ${row.number}; nothing was merged. Settle the fields named, then accept again.`,
            merged.conflicts,
          );
        }
        const saved = await revisionsRepo.saveDraft(trx, existing.id, existing.version, merged.document, analyse(merged.document), ENGINE_VERSION);
        if (!saved) throw staleVersion();
        revision = saved;
      } else {
        const document = doc(row.document);
        revision = await revisionsRepo.insert(trx, {
          system_id: systemId,
          number: await revisionsRepo.nextNumber(trx, systemId),
          document,
          analysis: analyse(document),
          engine_version: ENGINE_VERSION,
          created_by: actor.id,
          note: `From field change ${row.number} (“${row.title}”), proposed by ${contractor?.name ?? 'a contractor'}, on revision ${m.baseRevisionNumber}`,
        });
      }
      await fieldChangesRepo.setRevisionOrigin(trx, revision.id, id);
      const acceptedAt = new Date();
      const record: FieldChangeRecord = {
        fieldChangeId: id,
        number: row.number,
        title: row.title,
        baseRevisionNumber: m.baseRevisionNumber,
        proposedBy: { id: row.created_by, name: contractor?.name ?? '', email: contractor?.email ?? '' },
        proposedAt: iso(row.proposed_at ?? row.updated_at),
        acceptedBy: { id: actor.id, name: designer?.name ?? '', email: designer?.email ?? '' },
        acceptedAt: acceptedAt.toISOString(),
        comment,
        changes: describeChanges(doc(m.base!.document), doc(row.document)),
      };
      return {
        set: { decided_by: actor.id, decided_at: acceptedAt, accepted_revision_id: revision.id, record: JSON.stringify(record) },
        details: { revision: revision.number, comment },
        moreAudit: [
          {
            action: 'revision.drafted',
            subjectType: 'revision',
            subjectId: revision.id,
            details: { number: revision.number, from: m.baseRevisionNumber, fieldChangeId: id },
          },
        ],
        message: (to) =>
          fieldChangeDecidedMessage({
            ...m,
            recipientName: to.name,
            designerName: designer?.name ?? 'The designer',
            number: row.number,
            title: row.title,
            decision: 'accepted',
            text: comment,
            newRevisionNumber: revision.number,
          }),
        result: revision.id,
      };
    });
    return { fieldChange: await this.get(ctx, projectId, systemId, id), revision: await systemsService.revision(ctx, projectId, systemId, revisionId) };
  },

  async decline(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, id: string, version: number, reason: string): Promise<FieldChange> {
    await runTransition(ctx, actor, { projectId, systemId, id, version, action: 'decline' }, async (trx, row) => {
      const m = await mailContext(ctx, trx, row);
      const designer = await usersRepo.findById(trx, actor.id);
      return {
        set: { decided_by: actor.id, decided_at: trx.fn.now(), decline_reason: reason },
        details: { reason },
        message: (to) =>
          fieldChangeDecidedMessage({
            ...m,
            recipientName: to.name,
            designerName: designer?.name ?? 'The designer',
            number: row.number,
            title: row.title,
            decision: 'declined',
            text: reason,
            newRevisionNumber: null,
          }),
        result: undefined,
      };
    });
    return this.get(ctx, projectId, systemId, id);
  },

  /** The side by side, from two engine runs made now (the issued document and the field change's). */
  async comparison(ctx: ServiceContext, projectId: string, systemId: string, id: string): Promise<ComparisonResponse> {
    const row = await fieldChangesRepo.find(ctx.db, projectId, systemId, id);
    if (!row) throw notFound('The field change');
    const issuedDoc = doc(row.base_document);
    const proposedDoc = doc(row.document);
    return {
      fieldChangeId: id,
      baseRevision: { id: row.base_revision_id, number: row.base_number },
      ...compareDocuments(issuedDoc, proposedDoc, describeChanges(issuedDoc, proposedDoc)),
    };
  },
};
