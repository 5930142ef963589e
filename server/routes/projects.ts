import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole, requireUser } from '../http/guards';
import { membersService, projectsService } from '../services/projects';
import { AddMemberBody, CreateProjectBody, MemberParams, UpdateMemberBody, UpdateProjectBody } from '../../src/shared/api/projects';
import type { ServiceContext } from '../services/context';

export function projectsRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const memberOrAdmin = requireProjectRole(ctx.db, 'any', { administrators: true });
  const designer = requireProjectRole(ctx.db, ['designer']);
  const membershipManager = requireProjectRole(ctx.db, ['designer'], { administrators: true });

  router.get('/projects', requireUser, async (req, res) => {
    res.json({ projects: await projectsService.list(ctx, actorOf(req.user)) });
  });

  router.post('/projects', requireUser, async (req, res) => {
    const body = parse(CreateProjectBody, req.body);
    res.status(201).json({ project: await projectsService.create(ctx, actorOf(req.user), body as Required<typeof body>) });
  });

  router.get('/projects/:projectId', memberOrAdmin, async (req, res) => {
    res.json(await projectsService.get(ctx, String(req.params.projectId), req.projectRole ?? null));
  });

  router.patch('/projects/:projectId', designer, async (req, res) => {
    const body = parse(UpdateProjectBody, req.body);
    res.json({ project: await projectsService.update(ctx, actorOf(req.user), String(req.params.projectId), body) });
  });

  router.get('/projects/:projectId/members', memberOrAdmin, async (req, res) => {
    res.json({ members: await membersService.list(ctx, String(req.params.projectId)) });
  });

  router.post('/projects/:projectId/members', membershipManager, async (req, res) => {
    const body = parse(AddMemberBody, req.body);
    res.status(201).json({ member: await membersService.add(ctx, actorOf(req.user), String(req.params.projectId), body) });
  });

  router.patch('/projects/:projectId/members/:userId', membershipManager, async (req, res) => {
    const { projectId, userId } = parse(MemberParams, req.params);
    const body = parse(UpdateMemberBody, req.body);
    res.json({ member: await membersService.setRole(ctx, actorOf(req.user), projectId, userId, body.role) });
  });

  router.delete('/projects/:projectId/members/:userId', membershipManager, async (req, res) => {
    const { projectId, userId } = parse(MemberParams, req.params);
    await membersService.remove(ctx, actorOf(req.user), projectId, userId);
    res.status(204).end();
  });

  return router;
}
