import { Router, type RequestHandler } from 'express';
import { parse } from '../http/validate';
import { AppError } from '../http/errors';
import { requireAdmin } from '../http/guards';
import { devMailService } from '../mail/devMail';
import { DevMailAttachmentParams, DevMailListQuery, DevMailParams } from '../../src/shared/api/summaries';
import type { ServiceContext } from '../services/context';

/**
 * The development mail page's API: 404 to everyone unless HEADROOM_DEV_MAIL=1 and
 * HEADROOM_DEV_MAIL_PAGE=1, then administrators only, each seeing whole only the mail sent to them.
 */
export function devMailRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const enabled: RequestHandler = (req, _res, next) => {
    if (ctx.config.HEADROOM_DEV_MAIL !== '1' || ctx.config.HEADROOM_DEV_MAIL_PAGE !== '1')
      throw new AppError(404, 'NOT_FOUND', `No API route ${req.method} ${req.path}.`);
    next();
  };

  router.get('/dev/mail', enabled, requireAdmin, async (req, res) => {
    res.json({ messages: await devMailService.list(ctx, req.user!.email, parse(DevMailListQuery, req.query)) });
  });

  router.get('/dev/mail/:mailId', enabled, requireAdmin, async (req, res) => {
    const { mailId } = parse(DevMailParams, req.params);
    res.json({ message: await devMailService.get(ctx, req.user!.email, mailId) });
  });

  router.get('/dev/mail/:mailId/attachments/:index', enabled, requireAdmin, async (req, res) => {
    const { mailId, index } = parse(DevMailAttachmentParams, req.params);
    const a = await devMailService.attachment(ctx, req.user!.email, mailId, index);
    res.set({ 'Content-Type': a.contentType, 'Content-Disposition': `attachment; filename="${a.filename.replace(/"/g, '')}"` });
    res.send(a.content);
  });

  return router;
}
