import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole, requireRevisionInPath } from '../http/guards';
import { summariesService } from '../services/summaries';
import { outboxService } from '../services/outbox';
import { RevisionParams } from '../../src/shared/api/systems';
import { MessageParams, SendSummaryBody } from '../../src/shared/api/summaries';
import type { ServiceContext } from '../services/context';

export function summariesRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const member = requireProjectRole(ctx.db, 'any');
  const designer = requireProjectRole(ctx.db, ['designer']);
  const base = '/projects/:projectId/systems/:systemId/revisions/:revisionId';

  router.get(`${base}/summary`, member, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    res.json({ summary: await summariesService.info(ctx, projectId, systemId, revisionId) });
  });

  router.get(`${base}/summary.pdf`, member, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    const { bytes, sha256, fileName } = await summariesService.pdf(ctx, projectId, systemId, revisionId);
    res.set({
      'Content-Type': 'application/pdf',
      'Content-Disposition': `attachment; filename="${fileName}"`,
      ETag: `"${sha256}"`,
      'Cache-Control': 'private, no-cache',
    });
    res.send(bytes);
  });

  router.post(`${base}/summary/retry`, designer, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    res.json({ summary: await summariesService.retry(ctx, actorOf(req.user), projectId, systemId, revisionId) });
  });

  router.post(`${base}/summary/send`, designer, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    const body = parse(SendSummaryBody, req.body);
    res.status(202).json(await summariesService.send(ctx, actorOf(req.user), projectId, systemId, revisionId, body));
  });

  router.get(`${base}/messages`, designer, requireRevisionInPath(ctx.db), async (req, res) => {
    const { projectId, revisionId } = parse(RevisionParams, req.params);
    res.json({ messages: await outboxService.listForRevision(ctx, projectId, revisionId) });
  });

  router.post('/projects/:projectId/messages/:messageId/retry', designer, async (req, res) => {
    const { projectId, messageId } = parse(MessageParams, req.params);
    res.json({ message: await outboxService.retry(ctx, actorOf(req.user), projectId, messageId) });
  });

  return router;
}
