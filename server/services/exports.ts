/**
 * Exports of a revision's result for the engineer's report (segment table, fixture table, every
 * ledger), as CSV or one spreadsheet workbook. Read from the stored revision and its stored
 * analysis: an issued revision exports the numbers it was issued with.
 */
import type { SystemDocument } from '../../src/engine';
import { conflict, notFound } from './errors';
import { systemsRepo } from '../repositories/systems';
import { tableCsv, tablesXlsx } from '../exports/encode';
import { resultTables } from '../exports/resultTables';
import type { ServiceContext } from './context';
import { systemsService } from './systems';

export type ExportTable = 'segments' | 'fixtures' | 'ledgers';

async function tablesOf(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string) {
  const system = await systemsRepo.find(ctx.db, projectId, systemId);
  if (!system) throw notFound('The system');
  const revision = await systemsService.revision(ctx, projectId, systemId, revisionId);
  const stored = revision.analysis;
  if (!stored.ok) {
    throw conflict(`Revision ${revision.number} cannot be computed (${stored.error.message}); there is nothing to export.`);
  }
  const tables = resultTables(stored.analysis, revision.document as SystemDocument, {
    systemName: system.name,
    revisionNumber: revision.number,
    status: revision.status,
  });
  const base = `${system.name} rev ${revision.number}`.replace(/[^\p{L}\p{N} ._-]+/gu, '').trim() || 'headroom';
  return { tables, base, revision };
}

export const exportsService = {
  async csv(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string, table: ExportTable) {
    const { tables, base } = await tablesOf(ctx, projectId, systemId, revisionId);
    return { filename: `${base} ${table}.csv`, body: tableCsv(tables, table)! };
  },

  async xlsx(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string) {
    const { tables, base, revision } = await tablesOf(ctx, projectId, systemId, revisionId);
    const body = await tablesXlsx(tables, { title: base, created: new Date(revision.issuedAt ?? revision.updatedAt ?? Date.now()) });
    return { filename: `${base}.xlsx`, body };
  },
};
