import { randomUUID } from 'node:crypto';
import { ENGINE_VERSION, readSystemDocument, SystemDocumentSchema, verdictStatus, type IncompleteReason, type SystemDocument } from '../../src/engine';
import { ServiceError, conflict, invalid, notFound, staleVersion } from './errors';
import { fieldsFromZod } from './validationFields';
import { assertStorable } from './storable';
import { locks } from '../repositories/locks';
import { log } from '../log';
import { projectsRepo } from '../repositories/projects';
import { revisionsRepo, systemsRepo, type RevisionListRow, type RevisionRow, type RevisionSummaryRow, type SystemRow } from '../repositories/systems';
import { auditRepo } from '../repositories/audit';
import { iso, type Tx } from '../db/rows';
import { inputHash } from './canonicalJson';
import { summariesService } from './summaries';
import { analyse, analyseParsed, verdictOf } from './storedAnalysis';
import { reviewLoopService } from './reviewLoop';
import { hotWaterSupply } from './hotWaterSupply';
import type { Actor, ServiceContext } from './context';
import { ATTESTATION_STATEMENTS, type Attestation, type AttestationRecord } from '../../src/shared/api/systems';
import type {
  AnalysisOutcome,
  CompareResponse,
  CreateSystemBody,
  ReturnedMarker,
  Revision,
  RevisionOrigin,
  RevisionSummary,
  RevisionVerdict,
  SystemInfo,
} from '../../src/shared/api/systems';
import { FieldChangeRecord } from '../../src/shared/api/fieldChanges';
import { convertDocumentUnits } from '../../src/engine/building/convertUnits';
import type { UnitSystem } from '../../src/engine';

/** The server's analysis of a document (server/services/storedAnalysis.ts, where the stored form is made from it). */
export { analyse };

const toSummary = (r: RevisionSummaryRow, verdict: RevisionVerdict): RevisionSummary => ({
  id: r.id,
  number: r.number,
  status: r.status,
  version: r.version,
  updatedAt: iso(r.updated_at),
  issuedAt: r.issued_at ? iso(r.issued_at) : null,
  issuedBy: r.issued_by_name ?? null,
  inputHash: r.input_hash,
  verdict,
  failureAcknowledgement: r.failure_ack_statement
    ? { statement: r.failure_ack_statement, by: r.failure_ack_by_name ?? null, at: iso(r.failure_ack_at ?? r.updated_at) }
    : null,
  attestation: attestationOf(r),
});

/** The attestation recorded at issue, as the API and the summary show it. */
export const attestationOf = (r: RevisionSummaryRow): AttestationRecord | null =>
  r.attestation_statement && r.attestation_at
    ? {
        name: r.attestation_name ?? '',
        licenceNumber: r.attestation_licence ?? '',
        statement: r.attestation_statement,
        by: r.issued_by_name ?? null,
        at: iso(r.attestation_at),
      }
    : null;
const summaryOf = (r: RevisionListRow): RevisionSummary => toSummary(r, r.verdict);
const toRevision = (r: RevisionRow): Revision => ({
  ...summaryOf(r),
  document: r.document,
  analysis: r.analysis,
  engineVersion: r.engine_version,
  note: r.note,
  origin: originOf(r.field_change_record),
});

/** The revision's history line from the field change it was accepted from (null for a designer's own). */
function originOf(record: unknown): RevisionOrigin | null {
  const parsed = FieldChangeRecord.safeParse(typeof record === 'string' ? JSON.parse(record) : record);
  if (!parsed.success) return null;
  const r = parsed.data;
  return {
    fieldChangeId: r.fieldChangeId,
    number: r.number,
    title: r.title,
    baseRevisionNumber: r.baseRevisionNumber,
    proposedBy: r.proposedBy.name,
    proposedAt: r.proposedAt,
    acceptedBy: r.acceptedBy.name,
    acceptedAt: r.acceptedAt,
    comment: r.comment,
    changes: r.changes.map((c) => c.text),
  };
}
const toSystem = (s: SystemRow, latest: RevisionListRow | undefined, returned: ReturnedMarker | null = null): SystemInfo => ({
  id: s.id,
  projectId: s.project_id,
  name: s.name,
  service: s.service,
  createdAt: iso(s.created_at),
  latest: latest ? summaryOf(latest) : null,
  returned,
});

/** A new system starts with its source at zero pressure: nothing passes until real figures are entered. */
function starterDocument(name: string, service: 'cold' | 'hot', unitSystem: 'US' | 'SI', waterTemperature?: number): SystemDocument {
  // 60 °F cold and 140 °F hot water: common practice for design water temperatures.
  const defaultTemperature = unitSystem === 'US' ? (service === 'cold' ? 60 : 140) : service === 'cold' ? 15.6 : 60;
  return SystemDocumentSchema.parse({
    schemaVersion: 2,
    id: randomUUID(),
    name,
    service,
    unitSystem,
    waterTemperature: waterTemperature ?? defaultTemperature,
    source: { kind: 'utility-main', nodeId: 'connection', staticPressureLow: 0, staticPressureHigh: 0, pressureBasis: 'Not entered yet' },
    devices: [],
    nodes: [{ id: 'connection', label: 'Connection to the main', elevation: 0, fixtureGroups: [], checkedFixtures: [] }],
    segments: [],
  });
}

/** A stored document in the project's units (as it is when they already agree, or when it cannot be read). */
function inUnits(document: unknown, to: UnitSystem | undefined): unknown {
  const parsed = readSystemDocument(document, { riseConflict: 'follow-rises' });
  if (!to || !parsed.success || parsed.data.unitSystem === to) return document;
  return convertDocumentUnits(parsed.data, to, { round: true });
}

function parseDocument(document: unknown): SystemDocument {
  // A document written before version 2 is upgraded as a draft: its typed rises were the intent.
  const parsed = readSystemDocument(document, { riseConflict: 'follow-rises' });
  if (!parsed.success) {
    const fields = Object.fromEntries(Object.entries(fieldsFromZod(parsed.error)).map(([k, v]) => [`document.${k}`, v]));
    throw invalid('The system document does not match the format.', fields);
  }
  return parsed.data;
}

/**
 * May this analysis be issued? Incomplete (or not analysable) → 409 REVISION_INCOMPLETE with the
 * reasons; fail without an acknowledgement → 409 FAILURE_NOT_ACKNOWLEDGED; an acknowledgement on a
 * revision that does not fail → 409 NOTHING_TO_ACKNOWLEDGE (the verdict is not what the designer saw).
 */
export function issueGate(number: number, analysis: AnalysisOutcome, acknowledgeFailure: { statement: string } | null) {
  if (!analysis.ok) {
    const e = analysis.error;
    const reasons: IncompleteReason[] = [{ code: e.code, elementType: reasonElement(e.elementType), elementId: e.elementId, message: e.message }];
    throw new ServiceError('REVISION_INCOMPLETE', `Revision ${number} cannot be issued: the engine cannot compute it (${e.message})`, undefined, { reasons });
  }
  const status = verdictStatus(analysis.analysis);
  if (status === 'incomplete') {
    const reasons = analysis.analysis.verdict.incomplete.length
      ? analysis.analysis.verdict.incomplete
      : [
          {
            code: 'no-checked-fixtures',
            elementType: 'system' as const,
            elementId: null,
            message: 'No checked fixture: nothing was compared with a minimum flow pressure.',
          },
        ];
    throw new ServiceError(
      'REVISION_INCOMPLETE',
      `Revision ${number} cannot be issued: its description is incomplete (${reasons.length === 1 ? 'one item' : `${reasons.length} items`} to settle).`,
      undefined,
      { reasons },
    );
  }
  const failures = analysis.analysis.verdict.failures;
  if (status === 'fail' && !acknowledgeFailure) {
    throw new ServiceError(
      'FAILURE_NOT_ACKNOWLEDGED',
      `Revision ${number} fails ${failures === 1 ? 'one check' : `${failures} checks`}. It can be issued only with your acknowledgement of the failure, in your own words; the summary will say FAIL on its first line.`,
      undefined,
      { failures },
    );
  }
  if (status !== 'fail' && acknowledgeFailure) {
    throw new ServiceError(
      'NOTHING_TO_ACKNOWLEDGE',
      `Revision ${number} does not fail (its verdict is ${status}); issue it without an acknowledgement of failure.`,
    );
  }
  return { status, failures, acknowledgement: status === 'fail' ? acknowledgeFailure!.statement.trim() : null };
}

const REASON_ELEMENTS = new Set<IncompleteReason['elementType']>([
  'system',
  'source',
  'device',
  'node',
  'segment',
  'fixture-group',
  'checked-fixture',
  'fitting',
]);
const reasonElement = (t: string): IncompleteReason['elementType'] =>
  REASON_ELEMENTS.has(t as IncompleteReason['elementType']) ? (t as IncompleteReason['elementType']) : 'system';

const locked = (r: Pick<RevisionRow, 'number' | 'status'>) => conflict(`Revision ${r.number} is ${r.status}; it cannot change. Start a new draft from it.`);

export const systemsService = {
  async list(ctx: ServiceContext, projectId: string): Promise<SystemInfo[]> {
    const systems = await systemsRepo.listForProject(ctx.db, projectId);
    const latest = systems.length
      ? await revisionsRepo.latestForSystems(
          ctx.db,
          systems.map((s) => s.id),
        )
      : [];
    const returned = await reviewLoopService.markers(
      ctx.db,
      systems.map((s) => s.id),
    );
    return systems.map((s) =>
      toSystem(
        s,
        latest.find((r) => r.system_id === s.id),
        returned.get(s.id) ?? null,
      ),
    );
  },

  async create(ctx: ServiceContext, actor: Actor, projectId: string, body: CreateSystemBody) {
    const project = await projectsRepo.findById(ctx.db, projectId);
    if (!project) throw notFound('The project');
    const document =
      body.document !== undefined
        ? { ...parseDocument(body.document), name: body.name, service: body.service }
        : starterDocument(body.name, body.service, project.unit_system, body.waterTemperature);
    // after the document's own schema, so a malformed document is reported by the schema first
    assertStorable({ name: body.name, document });
    return ctx.db.transaction(async (trx) => {
      const system = await systemsRepo.insert(trx, { project_id: projectId, name: body.name, service: body.service, created_by: actor.id });
      const revision = await revisionsRepo.insert(trx, {
        system_id: system.id,
        number: 1,
        document,
        analysis: analyse(document),
        engine_version: ENGINE_VERSION,
        created_by: actor.id,
      });
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'system.created',
        subjectType: 'system',
        subjectId: system.id,
        details: { name: body.name, imported: body.document !== undefined },
      });
      return { system: toSystem(system, revision), revision: toRevision(revision) };
    });
  },

  async get(ctx: ServiceContext, projectId: string, systemId: string) {
    const system = await systemsRepo.find(ctx.db, projectId, systemId);
    if (!system) throw notFound('The system');
    const revisions = await revisionsRepo.listForSystem(ctx.db, systemId);
    const returned = await reviewLoopService.markers(ctx.db, [systemId]);
    return { system: toSystem(system, revisions[0], returned.get(systemId) ?? null), revisions: revisions.map(summaryOf) };
  },

  async revision(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string): Promise<Revision> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const revision = await revisionsRepo.find(ctx.db, systemId, revisionId);
    if (!revision) throw notFound('The revision');
    return toRevision({ ...revision, ...(await hotWaterSupply.refreshRow(ctx.db, projectId, revision)) });
  },

  /**
   * Saves a draft; the server recomputes the analysis with the same engine the client runs, stores
   * the document with the verdict (the draft's whole analysis is computed again when it is read:
   * server/services/storedAnalysis.ts), and answers the revision's summary (its new version and
   * verdict): the client has the document and its own analysis of it, so neither is read back nor
   * sent again. A hot system fed from a cold one has its supply resolved first (hotWaterSupply).
   * The write and its audit entry are one statement; when hot drafts are fed from this system, the
   * save is a transaction that recomputes them too.
   */
  async saveDraft(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    systemId: string,
    revisionId: string,
    typed: SystemDocument,
    version: number,
  ): Promise<RevisionSummary> {
    const document = await hotWaterSupply.resolve(ctx.db, projectId, typed);
    // the body's document was read by the schema's reader (server/http/documentGate.ts); a resolved supply is a new document
    const analysis = document === typed ? analyseParsed(typed) : analyse(document);
    const { saved, dependents } = await revisionsRepo.saveDraftAlone(ctx.db, {
      projectId,
      systemId,
      revisionId,
      version,
      actorId: actor.id,
      document,
      analysis,
      engineVersion: ENGINE_VERSION,
    });
    // a draft has no issuer, acknowledgement or attestation: the summary needs no join
    if (saved) return toSummary(saved, verdictOf(analysis));
    if (dependents) return this.saveDraftWithDependents(ctx, actor, projectId, systemId, revisionId, document, analysis, version);
    // nothing written: say why, as the checks of the transaction below do
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const current = await revisionsRepo.saveRefusal(ctx.db, systemId, revisionId);
    if (!current) throw notFound('The revision');
    if (current.status !== 'draft') throw locked(current);
    throw staleVersion();
  },

  /** A draft save when hot drafts are fed from this system: the save, its audit entry and their recomputation in one transaction. */
  async saveDraftWithDependents(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    systemId: string,
    revisionId: string,
    document: SystemDocument,
    analysis: AnalysisOutcome,
    version: number,
  ): Promise<RevisionSummary> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    return ctx.db.transaction(async (trx) => {
      const current = await revisionsRepo.lockForSave(trx, systemId, revisionId);
      if (!current) throw notFound('The revision');
      if (current.status !== 'draft') throw locked(current);
      if (current.version !== version) throw staleVersion();
      const saved = await revisionsRepo.saveDraft(trx, revisionId, version, document, analysis, ENGINE_VERSION);
      if (!saved) throw staleVersion();
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'revision.saved',
        subjectType: 'revision',
        subjectId: revisionId,
        details: { number: saved.number, version: saved.version },
      });
      await hotWaterSupply.refreshDependents(trx, projectId, systemId);
      return toSummary(saved, verdictOf(analysis));
    });
  },

  /**
   * Issues a draft. The draft is analysed again with the current engine, and that analysis is the
   * one issued: an incomplete (or unanalysable) draft is refused with the reasons; a failing one
   * needs the designer's acknowledgement in their own words, recorded on the revision and in the
   * audit log. Nothing is written when it is refused. Its summary row (pending) is written in the
   * same transaction and the PDF is made right after the commit (server/services/summaries.ts); a
   * failure there leaves the revision issued and the summary "failed" with its reason.
   */
  async issue(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    systemId: string,
    revisionId: string,
    version: number,
    note: string | null,
    acknowledgeFailure: { statement: string } | null,
    attestation: Attestation,
  ): Promise<Revision> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    const revision = await ctx.db.transaction(async (trx) => {
      // the lock order of server/repositories/locks.ts: the system, then its revisions
      await locks.system(trx, systemId);
      const found = await revisionsRepo.findForUpdate(trx, systemId, revisionId);
      if (!found) throw notFound('The revision');
      if (found.status !== 'draft') throw locked(found);
      if (found.version !== version) throw staleVersion();
      const current = await hotWaterSupply.refreshRow(trx, projectId, found);
      const analysis = analyse(current.document);
      const gate = issueGate(current.number, analysis, acknowledgeFailure);
      const issued = await revisionsRepo.issue(trx, revisionId, version, actor.id, {
        inputHash: inputHash(current.document),
        note,
        analysis,
        engineVersion: ENGINE_VERSION,
        failureAcknowledgement: gate.acknowledgement,
        attestation: { name: attestation.name, licenceNumber: attestation.licenceNumber, statement: ATTESTATION_STATEMENTS[attestation.basis] },
      });
      if (!issued) throw staleVersion();
      // the returned review of the revision being superseded is answered by this one (its replies freeze)
      await reviewLoopService.markAnswered(trx, systemId, revisionId);
      await revisionsRepo.supersedeIssued(trx, systemId, revisionId);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'revision.issued',
        subjectType: 'revision',
        subjectId: revisionId,
        details: {
          number: issued.number,
          inputHash: issued.input_hash,
          verdict: gate.status,
          attestation: { name: attestation.name, licenceNumber: attestation.licenceNumber, basis: attestation.basis },
          ...(gate.acknowledgement ? { failureAcknowledgement: gate.acknowledgement } : {}),
        },
      });
      if (gate.acknowledgement) {
        await auditRepo.record(trx, {
          actorId: actor.id,
          projectId,
          action: 'revision.failure-acknowledged',
          subjectType: 'revision',
          subjectId: revisionId,
          details: { number: issued.number, statement: gate.acknowledgement, failures: gate.failures },
        });
      }
      await hotWaterSupply.refreshDependents(trx, projectId, systemId);
      await summariesService.recordIssue(trx, projectId, systemId, revisionId);
      return toRevision((await revisionsRepo.find(trx, systemId, revisionId))!);
    });
    // the PDF's own failures are recorded on the summary; anything else must not undo the issue
    await summariesService.generate(ctx, projectId, systemId, revisionId).catch((err) => log.error({ err, revisionId }, `summary of revision ${revisionId}`));
    return revision;
  },

  /**
   * After the project's unit system changed: every system's draft is converted to it (each number
   * with a unit, rounded to the places a designer writes in that unit: src/engine/building/
   * convertUnits.ts), analysed again and saved as a new version, in the caller's transaction.
   * Issued revisions stay as issued; a draft started from one later is converted then (newDraft).
   */
  async convertDrafts(trx: Tx, actor: Actor, projectId: string, to: UnitSystem): Promise<number> {
    let converted = 0;
    for (const system of await systemsRepo.listForProject(trx, projectId)) {
      await locks.system(trx, system.id);
      const draft = await revisionsRepo.draftOf(trx, system.id);
      if (!draft) continue;
      const before = parseDocument(draft.document);
      if (before.unitSystem === to) continue;
      const document = convertDocumentUnits(before, to, { round: true });
      const saved = await revisionsRepo.saveDraft(trx, draft.id, draft.version, document, analyse(document), ENGINE_VERSION);
      if (!saved) throw staleVersion();
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'revision.units-converted',
        subjectType: 'revision',
        subjectId: draft.id,
        details: { number: draft.number, from: before.unitSystem, to, version: saved.version },
      });
      converted++;
    }
    return converted;
  },

  /** A new draft copied from any revision; a system has at most one draft. */
  async newDraft(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, fromRevisionId: string): Promise<Revision> {
    if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
    return ctx.db.transaction(async (trx) => {
      await locks.system(trx, systemId);
      const existing = await revisionsRepo.draftOf(trx, systemId);
      if (existing) throw conflict(`Revision ${existing.number} is already a draft; continue there.`);
      const from = await revisionsRepo.find(trx, systemId, fromRevisionId);
      if (!from) throw notFound('The revision');
      const number = await revisionsRepo.nextNumber(trx, systemId);
      // a draft is in the project's units: a revision issued before the project switched is converted in its copy
      const project = await projectsRepo.findById(trx, projectId);
      const document = inUnits(from.document, project?.unit_system);
      const revision = await revisionsRepo.insert(trx, {
        system_id: systemId,
        number,
        document,
        analysis: analyse(document),
        engine_version: ENGINE_VERSION,
        created_by: actor.id,
        note: `Started from revision ${from.number}`,
      });
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'revision.drafted',
        subjectType: 'revision',
        subjectId: revision.id,
        details: { number, from: from.number },
      });
      return toRevision((await revisionsRepo.find(trx, systemId, revision.id))!);
    });
  },

  async compare(ctx: ServiceContext, projectId: string, systemId: string, aId: string, bId: string): Promise<CompareResponse> {
    const [a, b] = await Promise.all([this.revision(ctx, projectId, systemId, aId), this.revision(ctx, projectId, systemId, bId)]);
    const fa = a.analysis.ok ? a.analysis.analysis : null;
    const fb = b.analysis.ok ? b.analysis.analysis : null;
    const ids = [...new Set([...(fa?.fixtures ?? []).map((f) => f.id), ...(fb?.fixtures ?? []).map((f) => f.id)])];
    const fixtures = ids.map((id) => {
      const x = fa?.fixtures.find((f) => f.id === id);
      const y = fb?.fixtures.find((f) => f.id === id);
      return {
        id,
        label: y?.label ?? x?.label ?? id,
        marginA: x?.margin ?? null,
        marginB: y?.margin ?? null,
        delta: x && y ? y.margin - x.margin : null,
        passA: x?.pass ?? null,
        passB: y?.pass ?? null,
      };
    });
    const segA = new Map(((a.document as SystemDocument).segments ?? []).map((s) => [s.id, s]));
    const segB = new Map(((b.document as SystemDocument).segments ?? []).map((s) => [s.id, s]));
    const segments: CompareResponse['segments'] = [];
    for (const [id, s] of segA) {
      const t = segB.get(id);
      if (!t) segments.push({ id, change: 'removed', fields: [] });
      else {
        const keys = [...new Set([...Object.keys(s), ...Object.keys(t)])] as (keyof typeof s)[];
        const fields = keys.filter((k) => JSON.stringify(s[k]) !== JSON.stringify(t[k]));
        if (fields.length) segments.push({ id, change: 'changed', fields: fields as string[] });
      }
    }
    for (const id of segB.keys()) if (!segA.has(id)) segments.push({ id, change: 'added', fields: [] });
    return { a, b, fixtures, segments, pressureUnit: fb?.units.pressure ?? fa?.units.pressure ?? '' };
  },
};
