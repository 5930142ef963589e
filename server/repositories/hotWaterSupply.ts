import type { Tx } from '../db/rows';
import type { RevisionRow, SystemRow } from './systems';

/** The queries behind a hot system's supply read from a cold system (services/hotWaterSupply.ts). */
export const hotWaterSupplyRepo = {
  /** The revision whose analysis a fed hot system reads: the draft, or else the current issued one. */
  async currentRevision(db: Tx, systemId: string): Promise<RevisionRow | undefined> {
    return db<RevisionRow>('revisions')
      .where({ system_id: systemId })
      .whereIn('status', ['draft', 'issued'])
      .orderByRaw("CASE status WHEN 'draft' THEN 0 ELSE 1 END")
      .orderBy('number', 'desc')
      .first();
  },
  hotSystems: (db: Tx, projectId: string) => db<SystemRow>('systems').where({ project_id: projectId, service: 'hot' }),
  drafts: (db: Tx, systemIds: string[]) => db<RevisionRow>('revisions').whereIn('system_id', systemIds).where({ status: 'draft' }),
  /**
   * Rewrites a draft's derived supply and its analysis. The version is not bumped: nothing the
   * designer typed changes, and every save resolves the supply again, so a page holding the older
   * version loses nothing by saving over it.
   */
  async refreshDraft(db: Tx, revisionId: string, document: unknown, analysis: unknown, engineVersion: string): Promise<RevisionRow | undefined> {
    const [row] = await db<RevisionRow>('revisions')
      .where({ id: revisionId, status: 'draft' })
      .update({ document: JSON.stringify(document), analysis: JSON.stringify(analysis), engine_version: engineVersion, updated_at: db.fn.now() } as never)
      .returning('*');
    return row as RevisionRow | undefined;
  },
};
