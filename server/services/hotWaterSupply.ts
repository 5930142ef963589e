/**
 * A hot-water system fed from a cold-water system (document `source.fedFrom`): its supply is read
 * from the cold system's current analysis (its draft, else its current issued revision) by the
 * engine's one resolver (src/engine/hotWater/fedFrom.ts), never copied by hand. Resolved when a hot
 * draft is saved, issued or read, and for every hot draft fed from a cold system when that cold
 * system's draft is saved or issued. Issued revisions never change.
 */
import { applyFedFrom, ENGINE_VERSION, type ColdSupplyView, type SystemDocument } from '../../src/engine';
import type { Tx } from '../db/rows';
import { hotWaterSupplyRepo } from '../repositories/hotWaterSupply';
import { systemsRepo, type RevisionRow } from '../repositories/systems';
import { analyse } from './systems';

async function coldView(db: Tx, projectId: string, systemId: string): Promise<ColdSupplyView | null> {
  const system = await systemsRepo.find(db, projectId, systemId);
  if (!system) return null;
  const revision = await hotWaterSupplyRepo.currentRevision(db, system.id);
  return {
    systemId: system.id,
    name: system.name,
    service: system.service,
    revision: revision
      ? {
          number: revision.number,
          status: revision.status === 'draft' ? 'draft' : 'issued',
          analysis: revision.analysis as NonNullable<ColdSupplyView['revision']>['analysis'],
          document: revision.document,
        }
      : null,
  };
}

const fedFromOf = (document: unknown) => (document as SystemDocument | null)?.source?.fedFrom;

export const hotWaterSupply = {
  /** The document with its supply resolved (the same object when it is not fed from a system, or nothing changed). */
  async resolve(db: Tx, projectId: string, document: SystemDocument): Promise<SystemDocument> {
    const fedFrom = document.source.fedFrom;
    if (!fedFrom) return document;
    return applyFedFrom(document, await coldView(db, projectId, fedFrom.systemId));
  },

  /** A draft fed from a cold system, with its supply and analysis brought up to date (written back when they changed). */
  async refreshRow(db: Tx, projectId: string, row: RevisionRow): Promise<RevisionRow> {
    if (row.status !== 'draft' || !fedFromOf(row.document)) return row;
    const document = row.document as SystemDocument;
    const next = await this.resolve(db, projectId, document);
    if (next === document) return row;
    return (await hotWaterSupplyRepo.refreshDraft(db, row.id, next, analyse(next), ENGINE_VERSION)) ?? row;
  },

  /** After a cold system's draft changed: every hot draft of the project fed from it is recomputed. */
  async refreshDependents(db: Tx, projectId: string, coldSystemId: string): Promise<void> {
    const hot = await hotWaterSupplyRepo.hotSystems(db, projectId);
    if (hot.length === 0) return;
    const drafts = await hotWaterSupplyRepo.drafts(
      db,
      hot.map((s) => s.id),
    );
    for (const draft of drafts) {
      if (fedFromOf(draft.document)?.systemId === coldSystemId) await this.refreshRow(db, projectId, draft);
    }
  },
};
