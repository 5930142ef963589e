import { Router } from 'express';
import { parse } from '../http/validate';
import { requireProjectRole } from '../http/guards';
import { auditService } from '../services/audit';
import { ProjectParams } from '../../src/shared/api/projects';
import { AuditQuery } from '../../src/shared/api/summaries';
import type { ServiceContext } from '../services/context';

export function auditRoutes(ctx: ServiceContext): Router {
  const router = Router();
  router.get('/projects/:projectId/audit', requireProjectRole(ctx.db, ['designer']), async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    res.json(await auditService.list(ctx, projectId, parse(AuditQuery, req.query)));
  });
  return router;
}
