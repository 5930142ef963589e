import type { Tx } from '../db/rows';
import type { RevisionRow } from './systems';
import type { ChangeItem, FieldChangeRecord, FieldChangeStatus } from '../../src/shared/api/fieldChanges';

export interface FieldChangeRow {
  id: string;
  project_id: string;
  system_id: string;
  base_revision_id: string;
  number: number;
  title: string;
  description: string;
  status: FieldChangeStatus;
  document: unknown;
  analysis: unknown;
  engine_version: string;
  version: number;
  created_by: string;
  proposed_at: Date | null;
  decided_by: string | null;
  decided_at: Date | null;
  decline_reason: string | null;
  accepted_revision_id: string | null;
  record: FieldChangeRecord | null;
  created_at: Date;
  updated_at: Date;
}

/** A row with what its presentation needs from other tables. */
export interface FieldChangeListRow extends FieldChangeRow {
  system_name: string;
  base_number: number;
  base_status: 'draft' | 'issued' | 'superseded';
  accepted_number: number | null;
  author_name: string;
  author_email: string;
  decider_name: string | null;
  decider_email: string | null;
  attachment_count: string | number;
  /** the issued document the field change started from */
  base_document: unknown;
}

const LIST_COLUMNS = [
  'fc.*',
  's.name as system_name',
  'b.number as base_number',
  'b.status as base_status',
  'b.document as base_document',
  'ar.number as accepted_number',
  'au.name as author_name',
  'au.email as author_email',
  'du.name as decider_name',
  'du.email as decider_email',
];

function listQuery(db: Tx) {
  return db('field_changes as fc')
    .join('systems as s', 's.id', 'fc.system_id')
    .join('revisions as b', 'b.id', 'fc.base_revision_id')
    .leftJoin('revisions as ar', 'ar.id', 'fc.accepted_revision_id')
    .join('users as au', 'au.id', 'fc.created_by')
    .leftJoin('users as du', 'du.id', 'fc.decided_by')
    .select(LIST_COLUMNS)
    .select(db.raw('(SELECT count(*) FROM field_change_attachments a WHERE a.field_change_id = fc.id) AS attachment_count'));
}

export const fieldChangesRepo = {
  listForSystem: (db: Tx, projectId: string, systemId: string) =>
    listQuery(db).where({ 'fc.project_id': projectId, 'fc.system_id': systemId }).orderBy('fc.number', 'desc') as Promise<FieldChangeListRow[]>,
  listForProject: (db: Tx, projectId: string, status?: FieldChangeStatus) => {
    const q = listQuery(db)
      .where('fc.project_id', projectId)
      .orderBy([{ column: 'fc.updated_at', order: 'desc' }]);
    if (status) q.where('fc.status', status);
    return q as Promise<FieldChangeListRow[]>;
  },
  find: (db: Tx, projectId: string, systemId: string, id: string) =>
    listQuery(db).where({ 'fc.id': id, 'fc.project_id': projectId, 'fc.system_id': systemId }).first() as Promise<FieldChangeListRow | undefined>,
  async nextNumber(db: Tx, systemId: string): Promise<number> {
    const row = (await db('field_changes').where({ system_id: systemId }).max({ n: 'number' }).first()) as { n: number | null };
    return (row?.n ?? 0) + 1;
  },
  async insert(
    db: Tx,
    values: Pick<
      FieldChangeRow,
      'project_id' | 'system_id' | 'base_revision_id' | 'number' | 'title' | 'description' | 'document' | 'analysis' | 'engine_version' | 'created_by'
    >,
  ) {
    const [row] = await db('field_changes')
      .insert({ ...values, document: JSON.stringify(values.document), analysis: JSON.stringify(values.analysis) })
      .returning('*');
    return row as FieldChangeRow;
  },
  /** Optimistic update of a draft; undefined when the version is stale or it is no longer a draft. */
  async updateDraft(
    db: Tx,
    id: string,
    version: number,
    values: { title?: string; description?: string; document?: unknown; analysis?: unknown; engine_version?: string },
  ) {
    const set: Record<string, unknown> = { version: db.raw('version + 1'), updated_at: db.fn.now() };
    if (values.title !== undefined) set.title = values.title;
    if (values.description !== undefined) set.description = values.description;
    if (values.document !== undefined) set.document = JSON.stringify(values.document);
    if (values.analysis !== undefined) set.analysis = JSON.stringify(values.analysis);
    if (values.engine_version !== undefined) set.engine_version = values.engine_version;
    const [row] = await db('field_changes').where({ id, version, status: 'draft' }).update(set).returning('*');
    return row as FieldChangeRow | undefined;
  },
  /** Moves `from` → `to` at `version`; undefined when either does not hold any more. */
  async transition(db: Tx, id: string, version: number, from: FieldChangeStatus, to: FieldChangeStatus, values: Record<string, unknown> = {}) {
    const [row] = await db('field_changes')
      .where({ id, version, status: from })
      .update({ ...values, status: to, version: db.raw('version + 1'), updated_at: db.fn.now() })
      .returning('*');
    return row as FieldChangeRow | undefined;
  },
  /** The accepted field change a revision came from: what its issued summary prints. */
  async recordForRevision(db: Tx, revisionId: string): Promise<FieldChangeRecord | null> {
    const row = await db('revisions as r').join('field_changes as fc', 'fc.id', 'r.field_change_id').where('r.id', revisionId).first('fc.record');
    return (row?.record as FieldChangeRecord | null) ?? null;
  },
  setRevisionOrigin: (db: Tx, revisionId: string, fieldChangeId: string) =>
    db('revisions').where({ id: revisionId, status: 'draft' }).update({ field_change_id: fieldChangeId }),
  /** The system's current issued revision, the only one a field change starts on or is decided against. */
  currentIssued: (db: Tx, systemId: string) => db<RevisionRow>('revisions').where({ system_id: systemId, status: 'issued' }).first(),
  /** Project designers, who receive proposed field changes. */
  designers: (db: Tx, projectId: string) =>
    db('project_members as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where({ 'm.project_id': projectId, 'm.role': 'designer' })
      .whereNot('u.status', 'disabled')
      .select('u.id', 'u.name', 'u.email') as Promise<{ id: string; name: string; email: string }[]>,
};

export type { ChangeItem };
