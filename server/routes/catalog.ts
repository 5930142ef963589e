import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole, requireUser } from '../http/guards';
import { catalogService } from '../services/catalog';
import { ProjectParams } from '../../src/shared/api/projects';
import { CatalogEntryParams, CreateCatalogEntryBody, updateCatalogEntryBody } from '../../src/shared/api/catalog';
import type { ServiceContext } from '../services/context';

export function catalogRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const member = requireProjectRole(ctx.db, 'any');
  const designer = requireProjectRole(ctx.db, ['designer']);

  /** The seeded catalogs, each entry with its published source; any signed-in user may read them. */
  router.get('/catalog', requireUser, async (_req, res) => {
    res.json({ entries: await catalogService.seeded(ctx) });
  });

  /** The seeded catalogs and the project's own entries (members; a non-member is told nothing). */
  router.get('/projects/:projectId/catalog', member, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    res.json(await catalogService.forProject(ctx, projectId));
  });

  router.post('/projects/:projectId/catalog/entries', designer, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    const body = parse(CreateCatalogEntryBody, req.body);
    res.status(201).json({ entry: await catalogService.add(ctx, actorOf(req.user), projectId, body) });
  });

  router.patch('/projects/:projectId/catalog/entries/:kind/:entryId', designer, async (req, res) => {
    const { projectId, kind, entryId } = parse(CatalogEntryParams, req.params);
    const body = parse(updateCatalogEntryBody(kind), req.body);
    res.json({ entry: await catalogService.update(ctx, actorOf(req.user), projectId, kind, entryId, body) });
  });

  router.delete('/projects/:projectId/catalog/entries/:kind/:entryId', designer, async (req, res) => {
    const { projectId, kind, entryId } = parse(CatalogEntryParams, req.params);
    await catalogService.remove(ctx, actorOf(req.user), projectId, kind, entryId);
    res.status(204).end();
  });

  return router;
}
