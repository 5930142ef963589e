import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole, requireRevisionInPath, requireUser } from '../http/guards';
import { reviewsService } from '../services/reviews';
import { RevisionParams } from '../../src/shared/api/systems';
import { ProjectParams } from '../../src/shared/api/projects';
import { DecideReviewBody, ReviewParams } from '../../src/shared/api/summaries';
import type { ServiceContext } from '../services/context';
import { reviewLoopService } from '../services/reviewLoop';
import { CommentParams, ReplyBody, SendPackageBody } from '../../src/shared/api/reviewLoop';
import { submissionsService } from '../services/submissions';

export function reviewsRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const member = requireProjectRole(ctx.db, 'any');
  const inspector = requireProjectRole(ctx.db, ['inspector']);
  const designer = requireProjectRole(ctx.db, ['designer']);

  router.get('/inbox', requireUser, async (req, res) => {
    res.json({ items: await reviewsService.inbox(ctx, actorOf(req.user)) });
  });

  router.get('/projects/:projectId/systems/:systemId/revisions/:revisionId/reviews', member, requireRevisionInPath(ctx.db), async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    res.json({ reviews: await reviewsService.forRevision(ctx, projectId, systemId, revisionId) });
  });

  router.get('/projects/:projectId/reviews', member, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    res.json({ reviews: await reviewsService.forProject(ctx, projectId) });
  });

  router.patch('/projects/:projectId/reviews/:reviewId', inspector, async (req, res) => {
    const { projectId, reviewId } = parse(ReviewParams, req.params);
    const body = parse(DecideReviewBody, req.body);
    res.json({ review: await reviewsService.decide(ctx, actorOf(req.user), projectId, reviewId, body) });
  });

  // ---- the review loop (src/shared/api/reviewLoop.ts)
  router.put('/projects/:projectId/reviews/:reviewId/comments/:commentId/reply', designer, async (req, res) => {
    const { projectId, reviewId, commentId } = parse(CommentParams, req.params);
    const { reply } = parse(ReplyBody, req.body);
    res.json({ review: await reviewsService.reply(ctx, actorOf(req.user), projectId, reviewId, commentId, reply) });
  });

  router.get('/projects/:projectId/systems/:systemId/revisions/:revisionId/answers', member, requireRevisionInPath(ctx.db), async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    res.json({ answers: await reviewsService.answers(ctx, projectId, systemId, revisionId) });
  });

  router.get('/projects/:projectId/reviews/:reviewId/acceptance.pdf', member, async (req, res) => {
    const { projectId, reviewId } = parse(ReviewParams, req.params);
    const { bytes, sha256, fileName } = await reviewLoopService.acceptancePdf(ctx, projectId, reviewId);
    res.set({
      'Content-Type': 'application/pdf',
      'Content-Disposition': `attachment; filename="${fileName}"`,
      ETag: `"${sha256}"`,
      'Cache-Control': 'private, no-cache',
    });
    res.send(bytes);
  });

  router.post('/projects/:projectId/submissions', designer, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    const body = parse(SendPackageBody, req.body);
    res.status(202).json(await submissionsService.sendPackage(ctx, actorOf(req.user), projectId, body));
  });

  return router;
}
