import type { Tx } from '../db/rows';

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
  analysis: unknown;
  engine_version: string;
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

const revisionColumns = ['r.*', 'u.name as issued_by_name', 'ua.name as failure_ack_by_name'];

export const systemsRepo = {
  listForProject: (db: Tx, projectId: string) => db<SystemRow>('systems').where({ project_id: projectId }).orderBy('created_at'),
  find: (db: Tx, projectId: string, systemId: string) => db<SystemRow>('systems').where({ id: systemId, project_id: projectId }).first(),
  async insert(db: Tx, values: { project_id: string; name: string; service: SystemRow['service']; created_by: string }) {
    const [row] = await db<SystemRow>('systems').insert(values).returning('*');
    return row;
  },
};

export const revisionsRepo = {
  listForSystem: (db: Tx, systemId: string) =>
    db<RevisionRow>('revisions as r').leftJoin('users as u', 'u.id', 'r.issued_by')
      .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by').where('r.system_id', systemId).select(revisionColumns).orderBy('r.number', 'desc'),
  /** the newest revision of each of the given systems */
  latestForSystems: (db: Tx, systemIds: string[]) =>
    db<RevisionRow>('revisions as r')
      .leftJoin('users as u', 'u.id', 'r.issued_by')
      .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
      .whereIn('r.system_id', systemIds)
      .distinctOn('r.system_id')
      .select(revisionColumns)
      .orderBy([{ column: 'r.system_id' }, { column: 'r.number', order: 'desc' }]),
  find: (db: Tx, systemId: string, revisionId: string) =>
    db<RevisionRow>('revisions as r')
      .leftJoin('users as u', 'u.id', 'r.issued_by')
      .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
      .leftJoin('field_changes as fc', 'fc.id', 'r.field_change_id')
      .where({ 'r.id': revisionId, 'r.system_id': systemId })
      .first([...revisionColumns, 'fc.record as field_change_record']),
  findForUpdate: (db: Tx, systemId: string, revisionId: string) => db<RevisionRow>('revisions').where({ id: revisionId, system_id: systemId }).forUpdate().first(),
  draftOf: (db: Tx, systemId: string) => db<RevisionRow>('revisions').where({ system_id: systemId, status: 'draft' }).first(),
  async nextNumber(db: Tx, systemId: string): Promise<number> {
    const row = (await db('revisions').where({ system_id: systemId }).max({ n: 'number' }).first()) as { n: number | null };
    return (row?.n ?? 0) + 1;
  },
  async insert(db: Tx, values: { system_id: string; number: number; document: unknown; analysis: unknown; engine_version: string; created_by: string; note?: string | null }) {
    const [row] = await db<RevisionRow>('revisions')
      .insert({ ...values, document: JSON.stringify(values.document), analysis: JSON.stringify(values.analysis) } as never)
      .returning('*');
    return row as RevisionRow;
  },
  /** Optimistic save of a draft: undefined when the version is stale or the revision is no longer a draft. */
  async saveDraft(db: Tx, revisionId: string, version: number, document: unknown, analysis: unknown, engineVersion: string) {
    const [row] = await db<RevisionRow>('revisions')
      .where({ id: revisionId, version, status: 'draft' })
      .update({ document: JSON.stringify(document), analysis: JSON.stringify(analysis), engine_version: engineVersion, version: db.raw('version + 1'), updated_at: db.fn.now() } as never)
      .returning('*');
    return row as RevisionRow | undefined;
  },
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
      analysis: unknown;
      engineVersion: string;
      failureAcknowledgement: string | null;
      attestation: { name: string; licenceNumber: string; statement: string };
    },
  ) {
    const ack = values.failureAcknowledgement;
    const [row] = await db<RevisionRow>('revisions')
      .where({ id: revisionId, version, status: 'draft' })
      .update({
        status: 'issued',
        issued_by: by,
        issued_at: db.fn.now(),
        input_hash: values.inputHash,
        note: values.note,
        analysis: JSON.stringify(values.analysis),
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
      } as never)
      .returning('*');
    return row as RevisionRow | undefined;
  },
  supersedeIssued: (db: Tx, systemId: string, exceptId: string) =>
    db('revisions').where({ system_id: systemId, status: 'issued' }).whereNot({ id: exceptId }).update({ status: 'superseded', updated_at: db.fn.now() }),
};
