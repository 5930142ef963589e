import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole } from '../http/guards';
import { asciiFallback, rfc5987, singleFileUpload } from '../http/upload';
import { AppError } from '../http/errors';
import { fieldChangesService } from '../services/fieldChanges';
import { attachmentsService } from '../services/attachments';
import { SystemParams } from '../../src/shared/api/systems';
import {
  AcceptFieldChangeBody,
  AttachmentParams,
  CreateFieldChangeBody,
  DEFAULT_UPLOAD_MAX_BYTES,
  DeclineFieldChangeBody,
  FieldChangeParams,
  ProjectFieldChangesQuery,
  ProjectParams,
  UpdateFieldChangeBody,
  VersionBody,
} from '../../src/shared/api/fieldChanges';
import type { ServiceContext } from '../services/context';

/** Field changes (issue 6); routes and their contract in src/shared/api/fieldChanges.ts. */
export function fieldChangesRoutes(ctx: ServiceContext, opts: { maxUploadBytes?: number } = {}): Router {
  const router = Router();
  const member = requireProjectRole(ctx.db, 'any');
  const designer = requireProjectRole(ctx.db, ['designer']);
  const contractor = requireProjectRole(ctx.db, ['contractor']);
  const upload = singleFileUpload(opts.maxUploadBytes ?? DEFAULT_UPLOAD_MAX_BYTES);
  const base = '/projects/:projectId/systems/:systemId/field-changes';
  const one = `${base}/:fieldChangeId`;

  router.get('/projects/:projectId/field-changes', member, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    const { status } = parse(ProjectFieldChangesQuery, req.query);
    res.json({ fieldChanges: await fieldChangesService.listForProject(ctx, projectId, status) });
  });

  router.get(base, member, async (req, res) => {
    const { projectId, systemId } = parse(SystemParams, req.params);
    res.json({ fieldChanges: await fieldChangesService.listForSystem(ctx, projectId, systemId) });
  });

  router.post(base, contractor, async (req, res) => {
    const { projectId, systemId } = parse(SystemParams, req.params);
    const body = parse(CreateFieldChangeBody, req.body);
    res.status(201).json({ fieldChange: await fieldChangesService.create(ctx, actorOf(req.user), projectId, systemId, body) });
  });

  router.get(one, member, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    res.json({ fieldChange: await fieldChangesService.get(ctx, projectId, systemId, fieldChangeId) });
  });

  router.patch(one, contractor, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    const body = parse(UpdateFieldChangeBody, req.body);
    res.json({ fieldChange: await fieldChangesService.update(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, body) });
  });

  router.get(`${one}/comparison`, member, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    res.json(await fieldChangesService.comparison(ctx, projectId, systemId, fieldChangeId));
  });

  router.post(`${one}/propose`, contractor, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    const { version } = parse(VersionBody, req.body);
    res.json({ fieldChange: await fieldChangesService.propose(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, version) });
  });

  router.post(`${one}/accept`, designer, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    const { version, comment } = parse(AcceptFieldChangeBody, req.body);
    res.json(await fieldChangesService.accept(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, version, comment || null));
  });

  router.post(`${one}/decline`, designer, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    const { version, reason } = parse(DeclineFieldChangeBody, req.body);
    res.json({ fieldChange: await fieldChangesService.decline(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, version, reason) });
  });

  // the role is checked before the body is read: a caller who may not upload never has a file buffered
  router.post(`${one}/attachments`, contractor, upload, async (req, res) => {
    const { projectId, systemId, fieldChangeId } = parse(FieldChangeParams, req.params);
    if (!req.file) throw new AppError(400, 'VALIDATION_FAILED', 'Attach one file.', { file: 'No file' });
    res.status(201).json({ attachment: await attachmentsService.add(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, req.file) });
  });

  router.get(`${one}/attachments/:attachmentId`, member, async (req, res) => {
    const { projectId, systemId, fieldChangeId, attachmentId } = parse(AttachmentParams, req.params);
    const { bytes, fileName, contentType, sha256 } = await attachmentsService.download(ctx, projectId, systemId, fieldChangeId, attachmentId);
    // RFC 6266: an ASCII filename= and the exact (already sanitised) name as UTF-8 in filename*=
    res.set({
      'Content-Type': contentType,
      'Content-Disposition': `attachment; filename="${asciiFallback(fileName)}"; filename*=UTF-8''${rfc5987(fileName)}`,
      'X-Content-Type-Options': 'nosniff',
      'Content-Security-Policy': "default-src 'none'; sandbox",
      ETag: `"${sha256}"`,
      'Cache-Control': 'private, no-cache',
    });
    res.send(bytes);
  });

  router.delete(`${one}/attachments/:attachmentId`, contractor, async (req, res) => {
    const { projectId, systemId, fieldChangeId, attachmentId } = parse(AttachmentParams, req.params);
    await attachmentsService.remove(ctx, actorOf(req.user), projectId, systemId, fieldChangeId, attachmentId);
    res.status(204).end();
  });

  return router;
}
