import { Router } from 'express';
import { requireUser } from '../http/guards';
import type { ServiceContext } from '../services/context';

export function catalogRoutes(ctx: ServiceContext): Router {
  const router = Router();
  /** The seeded catalogs, each entry with its published source; any signed-in user may read them. */
  router.get('/catalog', requireUser, async (_req, res) => {
    const rows = await ctx.db('catalog_entries').whereNull('project_id').orderBy(['kind', 'label']).select('kind', 'id', 'label', 'source', 'from_memory', 'data');
    res.json({ entries: rows.map((r) => ({ kind: r.kind, id: r.id, label: r.label, source: r.source, fromMemory: r.from_memory, data: r.data })) });
  });
  return router;
}
