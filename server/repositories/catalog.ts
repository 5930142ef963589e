import type { Tx } from '../db/rows';
import type { CatalogKind } from '../../src/shared/api/catalog';

export interface CatalogEntryRow {
  kind: CatalogKind;
  id: string;
  project_id: string | null;
  label: string;
  source: string;
  from_memory: boolean;
  data: unknown;
  version: number;
  created_by: string | null;
  updated_at: Date;
}

const COLUMNS = ['kind', 'id', 'project_id', 'label', 'source', 'from_memory', 'data', 'version', 'created_by', 'updated_at'] as const;

export const catalogRepo = {
  /** The seeded entries (project_id null), by kind and label. */
  seeded: (db: Tx) => db<CatalogEntryRow>('catalog_entries').whereNull('project_id').orderBy(['kind', 'label']).select(COLUMNS) as Promise<CatalogEntryRow[]>,

  /** One project's own entries, by kind and label. */
  ofProject: (db: Tx, projectId: string) =>
    db<CatalogEntryRow>('catalog_entries').where({ project_id: projectId }).orderBy(['kind', 'label', 'id']).select(COLUMNS) as Promise<CatalogEntryRow[]>,

  find: (db: Tx, projectId: string, kind: CatalogKind, id: string) =>
    db<CatalogEntryRow>('catalog_entries').where({ project_id: projectId, kind, id }).first(COLUMNS) as Promise<CatalogEntryRow | undefined>,

  async insert(
    db: Tx,
    v: { projectId: string; kind: CatalogKind; id: string; label: string; source: string; data: unknown; createdBy: string },
  ): Promise<CatalogEntryRow> {
    const [row] = await db('catalog_entries')
      .insert({
        project_id: v.projectId,
        kind: v.kind,
        id: v.id,
        label: v.label,
        source: v.source,
        from_memory: false,
        data: JSON.stringify(v.data),
        created_by: v.createdBy,
      })
      .returning(COLUMNS);
    return row as CatalogEntryRow;
  },

  /** Changes the entry only at `version` (optimistic concurrency); undefined when it was changed meanwhile or is gone. */
  async update(
    db: Tx,
    projectId: string,
    kind: CatalogKind,
    id: string,
    version: number,
    v: { label?: string; source?: string; data?: unknown },
  ): Promise<CatalogEntryRow | undefined> {
    const patch: Record<string, unknown> = { version: db.raw('version + 1'), updated_at: db.fn.now() };
    if (v.label !== undefined) patch.label = v.label;
    if (v.source !== undefined) patch.source = v.source;
    if (v.data !== undefined) patch.data = JSON.stringify(v.data);
    const [row] = await db('catalog_entries').where({ project_id: projectId, kind, id, version }).update(patch).returning(COLUMNS);
    return row as CatalogEntryRow | undefined;
  },

  remove: async (db: Tx, projectId: string, kind: CatalogKind, id: string) =>
    (await db('catalog_entries').where({ project_id: projectId, kind, id }).delete()) === 1,
};
