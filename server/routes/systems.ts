import { Router } from 'express';
import { parse } from '../http/validate';
import { actorOf, requireProjectRole } from '../http/guards';
import { systemsService } from '../services/systems';
import { exportsService } from '../services/exports';
import { asciiFallback, rfc5987 } from '../http/upload';
import {
  CompareQuery,
  CreateSystemBody,
  ExportTableParams,
  IssueBody,
  NewDraftBody,
  RevisionParams,
  SaveDocumentBody,
  SystemParams,
  type SaveDocumentResponse,
} from '../../src/shared/api/systems';
import { ProjectParams } from '../../src/shared/api/projects';
import type { ServiceContext } from '../services/context';

export function systemsRoutes(ctx: ServiceContext): Router {
  const router = Router();
  const member = requireProjectRole(ctx.db, 'any');
  const designer = requireProjectRole(ctx.db, ['designer']);
  const base = '/projects/:projectId/systems';

  router.get(base, member, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    res.json({ systems: await systemsService.list(ctx, projectId) });
  });

  router.post(base, designer, async (req, res) => {
    const { projectId } = parse(ProjectParams, req.params);
    const body = parse(CreateSystemBody, req.body, { storableCheck: false });
    res.status(201).json(await systemsService.create(ctx, actorOf(req.user), projectId, body));
  });

  router.get(`${base}/:systemId`, member, async (req, res) => {
    const { projectId, systemId } = parse(SystemParams, req.params);
    res.json(await systemsService.get(ctx, projectId, systemId));
  });

  router.get(`${base}/:systemId/compare`, member, async (req, res) => {
    const { projectId, systemId } = parse(SystemParams, req.params);
    const { a, b } = parse(CompareQuery, req.query);
    res.json(await systemsService.compare(ctx, projectId, systemId, a, b));
  });

  router.post(`${base}/:systemId/revisions`, designer, async (req, res) => {
    const { projectId, systemId } = parse(SystemParams, req.params);
    const { fromRevisionId } = parse(NewDraftBody, req.body);
    res.status(201).json({ revision: await systemsService.newDraft(ctx, actorOf(req.user), projectId, systemId, fromRevisionId) });
  });

  router.get(`${base}/:systemId/revisions/:revisionId`, member, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    res.json({ revision: await systemsService.revision(ctx, projectId, systemId, revisionId) });
  });

  router.put(`${base}/:systemId/revisions/:revisionId/document`, designer, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    const body = parse(SaveDocumentBody, req.body);
    // the revision's summary only (src/shared/api/systems.ts SaveDocumentResponse): the client has the document and its analysis
    const answer: SaveDocumentResponse = {
      revision: await systemsService.saveDraft(ctx, actorOf(req.user), projectId, systemId, revisionId, body.document, body.version),
    };
    res.json(answer);
  });

  router.post(`${base}/:systemId/revisions/:revisionId/issue`, designer, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    const body = parse(IssueBody, req.body);
    res.json({
      revision: await systemsService.issue(
        ctx,
        actorOf(req.user),
        projectId,
        systemId,
        revisionId,
        body.version,
        body.note ?? null,
        body.acknowledgeFailure ?? null,
        body.attestation,
      ),
    });
  });

  // the result for the engineer's report: one table as CSV, or all three as a spreadsheet workbook
  const download = (fileName: string, contentType: string) => ({
    'Content-Type': contentType,
    'Content-Disposition': `attachment; filename="${asciiFallback(fileName)}"; filename*=UTF-8''${rfc5987(fileName)}`,
    'X-Content-Type-Options': 'nosniff',
  });

  router.get(`${base}/:systemId/revisions/:revisionId/export/:table.csv`, member, async (req, res) => {
    const { projectId, systemId, revisionId, table } = parse(ExportTableParams, req.params);
    const { filename, body } = await exportsService.csv(ctx, projectId, systemId, revisionId, table);
    res.set(download(filename, 'text/csv; charset=utf-8')).send(body);
  });

  router.get(`${base}/:systemId/revisions/:revisionId/export.xlsx`, member, async (req, res) => {
    const { projectId, systemId, revisionId } = parse(RevisionParams, req.params);
    const { filename, body } = await exportsService.xlsx(ctx, projectId, systemId, revisionId);
    res.set(download(filename, 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')).send(body);
  });

  return router;
}
