/**
 * The catalogs: the seeded entries any signed-in user reads, and each project's own entries, which
 * its designers add, change and remove (each change in the audit log). A project's entry is copied
 * into a system document when chosen, so changing or removing it later changes no stored document.
 */
import { randomUUID } from 'node:crypto';
import { notFound, staleVersion } from './errors';
import { catalogRepo, type CatalogEntryRow } from '../repositories/catalog';
import { auditRepo } from '../repositories/audit';
import { iso } from '../db/rows';
import type { Actor, ServiceContext } from './context';
import {
  ProjectCatalogEntry,
  type CatalogKind,
  type CreateCatalogEntryBody,
  type ProjectCatalogResponse,
  type UpdateCatalogEntryBody,
} from '../../src/shared/api/catalog';

/**
 * What the walk reads of a project material's sizes: a key, the nominal size in inches and the
 * inside diameter. A project pipe has no nominal size of a published table, so its inside diameter
 * in inches stands in (as the engine does for a custom pipe, src/engine/analysis/input.ts).
 */
function stored(kind: CatalogKind, data: unknown): unknown {
  if (kind !== 'material') return data;
  const m = data as { sizes: { key: string; innerDiameterM: number }[] };
  return { ...m, sizes: m.sizes.map((s) => ({ key: s.key, nominalIn: s.innerDiameterM / 0.0254, innerDiameterM: s.innerDiameterM })) };
}

/** Back to the body's shape (the derived nominal size dropped), then presented. */
function present(row: CatalogEntryRow): ProjectCatalogEntry {
  const data =
    row.kind === 'material'
      ? {
          ...(row.data as object),
          sizes: (row.data as { sizes: { key: string; innerDiameterM: number }[] }).sizes.map((s) => ({ key: s.key, innerDiameterM: s.innerDiameterM })),
        }
      : row.data;
  return ProjectCatalogEntry.parse({
    kind: row.kind,
    id: row.id,
    label: row.label,
    source: row.source,
    fromMemory: false,
    projectId: row.project_id,
    version: row.version,
    createdBy: row.created_by,
    updatedAt: iso(row.updated_at),
    data,
  });
}

const seededOf = (r: CatalogEntryRow) => ({ kind: r.kind, id: r.id, label: r.label, source: r.source, fromMemory: r.from_memory, data: r.data });

export const catalogService = {
  async seeded(ctx: ServiceContext) {
    return (await catalogRepo.seeded(ctx.db)).map(seededOf);
  },

  async forProject(ctx: ServiceContext, projectId: string): Promise<ProjectCatalogResponse> {
    const [seeded, own] = await Promise.all([catalogRepo.seeded(ctx.db), catalogRepo.ofProject(ctx.db, projectId)]);
    return { entries: seeded.map(seededOf), projectEntries: own.map(present) };
  },

  async add(ctx: ServiceContext, actor: Actor, projectId: string, body: CreateCatalogEntryBody): Promise<ProjectCatalogEntry> {
    return ctx.db.transaction(async (trx) => {
      const row = await catalogRepo.insert(trx, {
        projectId,
        kind: body.kind,
        id: randomUUID(),
        label: body.label,
        source: body.source,
        data: stored(body.kind, body.data),
        createdBy: actor.id,
      });
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'catalog.entry-added',
        subjectType: 'catalog-entry',
        subjectId: row.id,
        details: { kind: row.kind, label: row.label, source: row.source },
      });
      return present(row);
    });
  },

  async update(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    kind: CatalogKind,
    id: string,
    body: UpdateCatalogEntryBody,
  ): Promise<ProjectCatalogEntry> {
    return ctx.db.transaction(async (trx) => {
      if (!(await catalogRepo.find(trx, projectId, kind, id))) throw notFound('The catalog entry');
      const row = await catalogRepo.update(trx, projectId, kind, id, body.version, {
        label: body.label,
        source: body.source,
        data: body.data === undefined ? undefined : stored(kind, body.data),
      });
      if (!row) throw staleVersion();
      const changed = (['label', 'source', 'data'] as const).filter((k) => body[k] !== undefined);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'catalog.entry-changed',
        subjectType: 'catalog-entry',
        subjectId: id,
        details: { kind, label: row.label, changed, version: row.version },
      });
      return present(row);
    });
  },

  async remove(ctx: ServiceContext, actor: Actor, projectId: string, kind: CatalogKind, id: string): Promise<void> {
    await ctx.db.transaction(async (trx) => {
      const row = await catalogRepo.find(trx, projectId, kind, id);
      if (!row || !(await catalogRepo.remove(trx, projectId, kind, id))) throw notFound('The catalog entry');
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'catalog.entry-removed',
        subjectType: 'catalog-entry',
        subjectId: id,
        details: { kind, label: row.label },
      });
    });
  },
};
