import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireAdmin } from '../http/guards';
import { usersService } from '../services/users';
import { CreateUserBody, UpdateUserBody, UserIdParams } from '../../src/shared/api/users';
import type { ServiceContext } from '../services/context';

export function usersRoutes(ctx: ServiceContext): Router {
  const router = Router();

  router.get('/users', requireAdmin, async (_req, res) => {
    res.json({ users: await usersService.list(ctx) });
  });

  router.post('/users', requireAdmin, async (req, res) => {
    const body = parse(CreateUserBody, req.body);
    res.status(201).json(await usersService.create(ctx, actorOf(req.user), body as Required<typeof body>));
  });

  router.patch('/users/:userId', requireAdmin, async (req, res) => {
    const { userId } = parse(UserIdParams, req.params);
    const body = parse(UpdateUserBody, req.body);
    res.json({ user: await usersService.update(ctx, actorOf(req.user), userId, body) });
  });

  router.post('/users/:userId/invitations', requireAdmin, async (req, res) => {
    const { userId } = parse(UserIdParams, req.params);
    res.status(201).json({ invitation: await usersService.reinvite(ctx, actorOf(req.user), userId) });
  });

  return router;
}
