import type { Tx } from '../db/rows';
import type { SummaryHeader } from '../../src/shared/api/summaries';

export interface SummaryRow {
  id: string;
  revision_id: string;
  project_id: string;
  status: 'pending' | 'ready' | 'failed';
  header: SummaryHeader;
  sha256: string | null;
  byte_length: number | null;
  page_count: number | null;
  generation_ms: number | null;
  error: string | null;
  created_at: Date;
  ready_at: Date | null;
}

/** every column but the PDF bytes (lists never carry them) */
const INFO_COLUMNS = [
  'id',
  'revision_id',
  'project_id',
  'status',
  'header',
  'sha256',
  'byte_length',
  'page_count',
  'generation_ms',
  'error',
  'created_at',
  'ready_at',
];

export const summariesRepo = {
  /** The pending row of a newly issued revision; nothing when it exists already. */
  async insertPending(db: Tx, values: { revision_id: string; project_id: string; header: SummaryHeader }) {
    await db('summaries')
      .insert({ ...values, header: JSON.stringify(values.header) })
      .onConflict('revision_id')
      .ignore();
  },
  findByRevision: (db: Tx, revisionId: string) =>
    db<SummaryRow>('summaries').where({ revision_id: revisionId }).first(INFO_COLUMNS) as Promise<SummaryRow | undefined>,
  findManyByRevision: (db: Tx, revisionIds: string[]) =>
    db<SummaryRow>('summaries').whereIn('revision_id', revisionIds).select(INFO_COLUMNS) as Promise<SummaryRow[]>,
  lockByRevision: (db: Tx, revisionId: string) =>
    db<SummaryRow>('summaries').where({ revision_id: revisionId }).forUpdate().first(INFO_COLUMNS) as Promise<SummaryRow | undefined>,
  async pdf(db: Tx, id: string): Promise<Buffer | null> {
    const row = await db('summaries').where({ id, status: 'ready' }).first('pdf');
    return row?.pdf ?? null;
  },
  markReady: (db: Tx, id: string, v: { pdf: Buffer; sha256: string; byte_length: number; page_count: number; generation_ms: number }) =>
    db('summaries')
      .where({ id })
      .whereNot({ status: 'ready' })
      .update({ ...v, status: 'ready', error: null, ready_at: db.fn.now() }),
  markFailed: (db: Tx, id: string, error: string) => db('summaries').where({ id }).whereNot({ status: 'ready' }).update({ status: 'failed', error }),
  markPending: (db: Tx, id: string) => db('summaries').where({ id, status: 'failed' }).update({ status: 'pending', error: null }),
};
