import type { Tx } from '../db/rows';
import type { AnalysisOutcome } from '../../src/shared/api/systems';
import { DRAFT_ANALYSIS_FORMAT, readStoredAnalysis, toStoredDraftAnalysis, verdictOf } from '../services/storedAnalysis';
import type { RevisionRow, SystemRow } from './systems';

type StoredRow = Omit<RevisionRow, 'analysis' | 'verdict' | 'analysis_format'> & { analysis: unknown };
/** Every analysis read here goes through the one reader of the stored form (server/services/storedAnalysis.ts). */
const read = (row: StoredRow | undefined): RevisionRow | undefined => {
  if (!row) return undefined;
  const r = readStoredAnalysis(row.analysis, row.engine_version, row.document);
  return { ...row, analysis: r.outcome, verdict: verdictOf(r.outcome), engine_version: r.engineVersion, analysis_format: r.format };
};

/** The queries behind a hot system's supply read from a cold system (services/hotWaterSupply.ts). */
export const hotWaterSupplyRepo = {
  /** The revision whose analysis a fed hot system reads: the draft, or else the current issued one. */
  async currentRevision(db: Tx, systemId: string): Promise<RevisionRow | undefined> {
    const row = await db<StoredRow>('revisions')
      .where({ system_id: systemId })
      .whereIn('status', ['draft', 'issued'])
      .orderByRaw("CASE status WHEN 'draft' THEN 0 ELSE 1 END")
      .orderBy('number', 'desc')
      .first();
    return read(row as StoredRow | undefined);
  },
  hotSystems: (db: Tx, projectId: string) => db<SystemRow>('systems').where({ project_id: projectId, service: 'hot' }),
  drafts: async (db: Tx, systemIds: string[]): Promise<RevisionRow[]> =>
    ((await db('revisions').whereIn('system_id', systemIds).where({ status: 'draft' })) as StoredRow[]).map((r) => read(r)!),
  /**
   * Rewrites a draft's derived supply and its analysis. The version is not bumped: nothing the
   * designer typed changes, and every save resolves the supply again, so a page holding the older
   * version loses nothing by saving over it.
   */
  async refreshDraft(db: Tx, revisionId: string, document: unknown, analysis: AnalysisOutcome, engineVersion: string): Promise<RevisionRow | undefined> {
    const [row] = await db('revisions')
      .where({ id: revisionId, status: 'draft' })
      .update({
        document: JSON.stringify(document),
        analysis: JSON.stringify(toStoredDraftAnalysis(analysis, engineVersion)),
        engine_version: engineVersion,
        updated_at: db.fn.now(),
      } as never)
      .returning('*');
    // the analysis just made is the one a read would compute from the stored document
    return row ? { ...(row as StoredRow), analysis, verdict: verdictOf(analysis), analysis_format: DRAFT_ANALYSIS_FORMAT } : undefined;
  },
};
