import type { Tx } from '../db/rows';
import type { AnalysisOutcome, RevisionVerdict } from '../../src/shared/api/systems';
import { readStoredAnalysis, readStoredVerdict, safeVerdictOf, toStoredDraftAnalysis, toStoredAnalysis, verdictOf } from '../services/storedAnalysis';

export interface SystemRow {
  id: string;
  project_id: string;
  name: string;
  service: 'cold' | 'hot';
  created_at: Date;
}

export interface RevisionRow {
  id: string;
  system_id: string;
  number: number;
  status: 'draft' | 'issued' | 'superseded';
  document: unknown;
  /** the stored analysis as read (server/services/storedAnalysis.ts), with every display value; a draft's computed from its document */
  analysis: AnalysisOutcome;
  /** what the lists show of `analysis` */
  verdict: RevisionVerdict;
  /** the engine version that made `analysis` */
  engine_version: string;
  /** the format the analysis was stored in (0: before formats) */
  analysis_format: number;
  version: number;
  input_hash: string | null;
  note: string | null;
  issued_by: string | null;
  issued_by_name?: string | null;
  issued_at: Date | null;
  updated_at: Date;
  /** the designer's acknowledgement of a failing verdict at issue (all three or none) */
  failure_ack_by: string | null;
  failure_ack_by_name?: string | null;
  failure_ack_at: Date | null;
  failure_ack_statement: string | null;
  /** the preparer's attestation at issue (all five or none) */
  attestation_by?: string | null;
  attestation_name?: string | null;
  attestation_licence?: string | null;
  attestation_statement?: string | null;
  attestation_at?: Date | null;
  /** the accepted field change's frozen record (src/shared/api/fieldChanges.ts FieldChangeRecord), on `find` only */
  field_change_record?: unknown;
}

/** A revision without its document and analysis: what a save answers (the large columns are neither read nor parsed). */
export type RevisionSummaryRow = Omit<RevisionRow, 'document' | 'analysis' | 'verdict' | 'analysis_format' | 'field_change_record'>;
/** A revision as the lists read it: its verdict, and no analysis computed. */
export type RevisionListRow = Omit<RevisionRow, 'analysis'>;

const revisionColumns = ['r.*', 'u.name as issued_by_name', 'ua.name as failure_ack_by_name'];
/** Every column of `revisions` but the document and the analysis. */
const SUMMARY_COLUMNS = [
  'id',
  'system_id',
  'number',
  'status',
  'engine_version',
  'version',
  'input_hash',
  'note',
  'issued_by',
  'issued_at',
  'updated_at',
  'failure_ack_by',
  'failure_ack_at',
  'failure_ack_statement',
  'attestation_by',
  'attestation_name',
  'attestation_licence',
  'attestation_statement',
  'attestation_at',
];

/** A row as the database holds it: the analysis in its stored form. */
type StoredRevisionRow = Omit<RevisionRow, 'analysis' | 'verdict' | 'analysis_format'> & { analysis: unknown };
/** The storage boundary of the analysis: every revision read goes through here. */
function fromDb(row: StoredRevisionRow): RevisionRow;
function fromDb(row: StoredRevisionRow | undefined): RevisionRow | undefined;
function fromDb(row: StoredRevisionRow | undefined): RevisionRow | undefined {
  if (!row) return undefined;
  const read = readStoredAnalysis(row.analysis, row.engine_version, row.document);
  return { ...row, analysis: read.outcome, verdict: safeVerdictOf(read.outcome), engine_version: read.engineVersion, analysis_format: read.format };
}
/** The lists' boundary: the verdict as stored, no analysis computed. */
function listedFromDb(row: StoredRevisionRow): RevisionListRow {
  const { analysis, ...rest } = row;
  const read = readStoredVerdict(analysis, row.engine_version);
  return { ...rest, verdict: read.verdict, engine_version: read.engineVersion, analysis_format: read.format };
}
/** Every revision these functions write is a draft: its verdict only (format 2); issuing writes the whole analysis (format 1). */
const storedDraftJson = (outcome: AnalysisOutcome, engineVersion: string) => JSON.stringify(toStoredDraftAnalysis(outcome, engineVersion));
const storedJson = (outcome: AnalysisOutcome, engineVersion: string) => JSON.stringify(toStoredAnalysis(outcome, engineVersion));

export const systemsRepo = {
  listForProject: (db: Tx, projectId: string) => db<SystemRow>('systems').where({ project_id: projectId }).orderBy('created_at'),
  find: (db: Tx, projectId: string, systemId: string) => db<SystemRow>('systems').where({ id: systemId, project_id: projectId }).first(),
  async insert(db: Tx, values: { project_id: string; name: string; service: SystemRow['service']; created_by: string }) {
    const [row] = await db<SystemRow>('systems').insert(values).returning('*');
    return row;
  },
};

export const revisionsRepo = {
  listForSystem: async (db: Tx, systemId: string): Promise<RevisionListRow[]> =>
    (
      (await db('revisions as r')
        .leftJoin('users as u', 'u.id', 'r.issued_by')
        .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
        .where('r.system_id', systemId)
        .select(revisionColumns)
        .orderBy('r.number', 'desc')) as StoredRevisionRow[]
    ).map(listedFromDb),
  /** the newest revision of each of the given systems */
  latestForSystems: async (db: Tx, systemIds: string[]): Promise<RevisionListRow[]> =>
    (
      (await db('revisions as r')
        .leftJoin('users as u', 'u.id', 'r.issued_by')
        .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
        .whereIn('r.system_id', systemIds)
        .distinctOn('r.system_id')
        .select(revisionColumns)
        .orderBy([{ column: 'r.system_id' }, { column: 'r.number', order: 'desc' }])) as StoredRevisionRow[]
    ).map(listedFromDb),
  find: async (db: Tx, systemId: string, revisionId: string): Promise<RevisionRow | undefined> =>
    fromDb(
      (await db('revisions as r')
        .leftJoin('users as u', 'u.id', 'r.issued_by')
        .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
        .leftJoin('field_changes as fc', 'fc.id', 'r.field_change_id')
        .where({ 'r.id': revisionId, 'r.system_id': systemId })
        .first([...revisionColumns, 'fc.record as field_change_record'])) as StoredRevisionRow | undefined,
    ),
  findForUpdate: async (db: Tx, systemId: string, revisionId: string): Promise<RevisionRow | undefined> =>
    fromDb((await db('revisions').where({ id: revisionId, system_id: systemId }).forUpdate().first()) as StoredRevisionRow | undefined),
  /** The issued revision of each of the given systems of a project, with the system's name. */
  issuedOfSystems: async (db: Tx, projectId: string, systemIds: string[]) =>
    (
      (await db('revisions as v')
        .join('systems as s', 's.id', 'v.system_id')
        .where('s.project_id', projectId)
        .whereIn('s.id', systemIds)
        .where('v.status', 'issued')
        .select('v.id', 'v.number', 'v.analysis', 'v.engine_version', 's.id as system_id', 's.name as system_name')) as {
        id: string;
        number: number;
        analysis: unknown;
        engine_version: string;
        system_id: string;
        system_name: string;
      }[]
    ).map((r) => ({ ...r, analysis: readStoredAnalysis(r.analysis, r.engine_version).outcome })),
  /** Locks a revision for a save and reads only what the save checks (its document and analysis stay unread). */
  lockForSave: (db: Tx, systemId: string, revisionId: string) =>
    db('revisions').where({ id: revisionId, system_id: systemId }).forUpdate().first('id', 'number', 'status', 'version') as Promise<
      Pick<RevisionRow, 'id' | 'number' | 'status' | 'version'> | undefined
    >,
  draftOf: async (db: Tx, systemId: string): Promise<RevisionRow | undefined> =>
    fromDb((await db('revisions').where({ system_id: systemId, status: 'draft' }).first()) as StoredRevisionRow | undefined),
  async nextNumber(db: Tx, systemId: string): Promise<number> {
    const row = (await db('revisions').where({ system_id: systemId }).max({ n: 'number' }).first()) as { n: number | null };
    return (row?.n ?? 0) + 1;
  },
  async insert(
    db: Tx,
    values: {
      system_id: string;
      number: number;
      document: unknown;
      analysis: AnalysisOutcome;
      engine_version: string;
      created_by: string;
      note?: string | null;
    },
  ) {
    const [row] = await db('revisions')
      .insert({ ...values, document: JSON.stringify(values.document), analysis: storedDraftJson(values.analysis, values.engine_version) })
      .returning('*');
    // the analysis just made is the one a read would compute from the stored document
    return { ...(row as StoredRevisionRow), analysis: values.analysis, verdict: verdictOf(values.analysis), analysis_format: 2 } satisfies RevisionRow;
  },
  /**
   * Optimistic save of a draft: undefined when the version is stale or the revision is no longer a
   * draft. Answers the saved row without its document and analysis (the caller has both).
   */
  async saveDraft(db: Tx, revisionId: string, version: number, document: unknown, analysis: AnalysisOutcome, engineVersion: string) {
    const [row] = await db('revisions')
      .where({ id: revisionId, version, status: 'draft' })
      .update({
        document: JSON.stringify(document),
        analysis: storedDraftJson(analysis, engineVersion),
        engine_version: engineVersion,
        version: db.raw('version + 1'),
        updated_at: db.fn.now(),
      })
      .returning(SUMMARY_COLUMNS);
    return row as RevisionSummaryRow | undefined;
  },
  /**
   * The designer's save of a draft in one statement (one round trip, its own transaction): the
   * optimistic write (`WHERE version = :version`: a stale version or a revision that is not a draft
   * of this project's system changes nothing) and its audit entry (`revision.saved`, the new number
   * and version) together. It writes nothing when a hot-water draft of the project is fed from this
   * system (`dependents`): that save takes the transaction that recomputes them. `saved` is
   * undefined when nothing was written; the caller asks `saveRefusal` why.
   */
  async saveDraftAlone(
    db: Tx,
    values: {
      projectId: string;
      systemId: string;
      revisionId: string;
      version: number;
      actorId: string;
      document: unknown;
      analysis: AnalysisOutcome;
      engineVersion: string;
    },
  ): Promise<{ saved: RevisionSummaryRow | undefined; dependents: boolean }> {
    const columns = SUMMARY_COLUMNS.map((c) => `r.${c}`).join(', ');
    const { rows } = (await db.raw(
      `WITH dependents AS (
         SELECT EXISTS (
           SELECT 1 FROM systems s JOIN revisions d ON d.system_id = s.id AND d.status = 'draft'
           WHERE s.project_id = :projectId AND s.service = 'hot' AND d.document #>> '{source,fedFrom,systemId}' = :systemId::text
         ) AS found
       ),
       saved AS (
         UPDATE revisions r
         SET document = :document::jsonb, analysis = :analysis::jsonb, engine_version = :engineVersion, version = r.version + 1, updated_at = now()
         WHERE r.id = :revisionId AND r.system_id = :systemId AND r.status = 'draft' AND r.version = :version
           AND EXISTS (SELECT 1 FROM systems s WHERE s.id = :systemId AND s.project_id = :projectId)
           AND NOT (SELECT found FROM dependents)
         RETURNING ${columns}
       ),
       audited AS (
         INSERT INTO audit_log (actor_id, project_id, action, subject_type, subject_id, details)
         SELECT :actorId::uuid, :projectId::uuid, 'revision.saved', 'revision', saved.id, jsonb_build_object('number', saved.number, 'version', saved.version)
         FROM saved
       )
       SELECT saved.*, (SELECT found FROM dependents) AS has_dependents FROM (SELECT 1) AS one LEFT JOIN saved ON true`,
      {
        ...values,
        document: JSON.stringify(values.document),
        analysis: storedDraftJson(values.analysis, values.engineVersion),
      },
    )) as { rows: (RevisionSummaryRow & { has_dependents: boolean })[] };
    const { has_dependents: dependents, ...row } = rows[0];
    return { saved: row.id ? row : undefined, dependents };
  },
  /** Why a draft save wrote nothing: the revision's number, status and version, or undefined when it is not this system's. */
  saveRefusal: (db: Tx, systemId: string, revisionId: string) =>
    db('revisions').where({ id: revisionId, system_id: systemId }).first('number', 'status', 'version') as Promise<
      Pick<RevisionRow, 'number' | 'status' | 'version'> | undefined
    >,
  /**
   * Issues a draft with the analysis it is issued on (made at issue time by the current engine) and,
   * for a failing one, the designer's acknowledgement; undefined when the version is stale.
   */
  async issue(
    db: Tx,
    revisionId: string,
    version: number,
    by: string,
    values: {
      inputHash: string;
      note: string | null;
      analysis: AnalysisOutcome;
      engineVersion: string;
      failureAcknowledgement: string | null;
      attestation: { name: string; licenceNumber: string; statement: string };
    },
  ) {
    const ack = values.failureAcknowledgement;
    const [row] = await db('revisions')
      .where({ id: revisionId, version, status: 'draft' })
      .update({
        status: 'issued',
        issued_by: by,
        issued_at: db.fn.now(),
        input_hash: values.inputHash,
        note: values.note,
        analysis: storedJson(values.analysis, values.engineVersion),
        engine_version: values.engineVersion,
        failure_ack_by: ack === null ? null : by,
        failure_ack_at: ack === null ? null : db.fn.now(),
        failure_ack_statement: ack,
        attestation_by: by,
        attestation_name: values.attestation.name,
        attestation_licence: values.attestation.licenceNumber,
        attestation_statement: values.attestation.statement,
        attestation_at: db.fn.now(),
        version: db.raw('version + 1'),
        updated_at: db.fn.now(),
      })
      .returning(SUMMARY_COLUMNS);
    return row as RevisionSummaryRow | undefined;
  },
  supersedeIssued: (db: Tx, systemId: string, exceptId: string) =>
    db('revisions').where({ system_id: systemId, status: 'issued' }).whereNot({ id: exceptId }).update({ status: 'superseded', updated_at: db.fn.now() }),
};
