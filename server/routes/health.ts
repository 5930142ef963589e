import { Router } from 'express';
import type { ServiceContext } from '../services/context';

export function healthRoutes(ctx: ServiceContext): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const database = await Promise.race([
      ctx.db.raw('select 1').then(
        () => 'up' as const,
        () => 'down' as const,
      ),
      new Promise<'down'>((resolve) => setTimeout(() => resolve('down'), 1000).unref()),
    ]);
    res.status(database === 'up' ? 200 : 503).json({ ok: database === 'up', database });
  });
  return router;
}
