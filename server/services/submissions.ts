/**
 * One submission for a building: the issued revisions of several systems of a project (cold, hot,
 * each zone) sent to inspectors together — one e-mail per inspector with one PDF per system
 * attached, and one review per system and inspector, grouped by the package so the comments stay
 * with their system. All or nothing, in one transaction.
 */
import { verdictStatus, type Analysis } from '../../src/engine';
import { revisionsRepo } from '../repositories/systems';
import type { AnalysisOutcome } from '../../src/shared/api/systems';
import { conflict, invalid, notFound } from './errors';
import { membersRepo, projectsRepo } from '../repositories/projects';
import { reviewsRepo } from '../repositories/reviews';
import { summariesRepo, type SummaryRow } from '../repositories/summaries';
import { usersRepo } from '../repositories/users';
import { auditRepo } from '../repositories/audit';
import { packageMessage } from '../mail/packageMessage';
import { outboxService, toMessageInfo } from './outbox';
import { reviewsService } from './reviews';
import { summariesService, verdictLine } from './summaries';
import type { Actor, ServiceContext } from './context';
import { resultViewPath } from '../../src/shared/api/summaries';
import type { SendPackageResponse } from '../../src/shared/api/reviewLoop';

/** The analysis of a revision already checked to have one (an incomplete or unanalysed one is refused above). */
const analysisOf = (a: AnalysisOutcome): Analysis => {
  if (!a.ok) throw new Error('a revision without an analysis reached the package');
  return a.analysis;
};

export const submissionsService = {
  async sendPackage(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    body: { systemIds: string[]; inspectorIds: string[]; message?: string },
  ): Promise<SendPackageResponse> {
    const project = await projectsRepo.findById(ctx.db, projectId);
    if (!project) throw notFound('The project');
    const fields: Record<string, string> = {};
    const systemIds = [...new Set(body.systemIds)];
    const issued = await revisionsRepo.issuedOfSystems(ctx.db, projectId, systemIds);
    const known: { id: string; name: string }[] = await ctx.db('systems').where({ project_id: projectId }).whereIn('id', systemIds).select('id', 'name');
    for (const [i, id] of body.systemIds.entries()) {
      const system = known.find((s) => s.id === id);
      if (!system) fields[`systemIds.${i}`] = 'Not a system of this project';
      else if (!issued.find((r) => r.system_id === id)) fields[`systemIds.${i}`] = `${system.name} has no issued revision: issue it first`;
    }
    for (const r of issued) {
      const a = r.analysis;
      if (!a.ok || verdictStatus(a.analysis) === 'incomplete')
        fields[`systemIds.${body.systemIds.indexOf(r.system_id)}`] = `${r.system_name}, revision ${r.number}, is incomplete: it has no summary`;
    }
    const recipients: { id: string; email: string; name: string }[] = [];
    for (const [i, userId] of body.inspectorIds.entries()) {
      const member = await membersRepo.find(ctx.db, projectId, userId);
      if (!member) fields[`inspectorIds.${i}`] = 'Not a member of this project';
      else if (member.role !== 'inspector') fields[`inspectorIds.${i}`] = `Is a ${member.role} here, not an inspector`;
      else if (!recipients.some((r) => r.id === member.userId)) recipients.push({ id: member.userId, email: member.email, name: member.name });
    }
    if (Object.keys(fields).length) throw invalid('This submission cannot be sent as it is.', fields);

    // in the order chosen; each summary made now if it is still pending
    const ordered = systemIds.map((id) => issued.find((r) => r.system_id === id)!);
    const summaries: SummaryRow[] = [];
    for (const r of ordered) {
      let s = await summariesRepo.findByRevision(ctx.db, r.id);
      if (!s || s.status === 'pending') s = await summariesService.generate(ctx, projectId, r.system_id, r.id);
      if (s.status !== 'ready')
        throw conflict(`The summary of ${r.system_name} could not be made, so the submission cannot be sent: ${s.error ?? 'unknown reason'}`);
      summaries.push(s);
    }
    const sender = await usersRepo.findById(ctx.db, actor.id);
    const base = ctx.config.PUBLIC_URL.replace(/\/$/, '');

    return ctx.db.transaction(async (trx) => {
      const [pkg] = await trx('submission_packages')
        .insert({ project_id: projectId, sent_by: actor.id, revision_ids: JSON.stringify(ordered.map((r) => r.id)), message: body.message ?? '' })
        .returning('id');
      const messages = [];
      const reviewIds: string[] = [];
      for (const to of recipients) {
        const m = packageMessage({
          recipientName: to.name,
          senderName: sender?.name ?? 'A designer',
          projectName: project.name,
          address: project.address,
          systems: ordered.map((r, i) => ({
            header: summaries[i].header,
            verdict: verdictLine(analysisOf(r.analysis)),
            viewUrl: `${base}${resultViewPath(projectId, r.system_id, r.id)}`,
          })),
          note: body.message,
        });
        const failing = ordered.some((r) => verdictStatus(analysisOf(r.analysis)) === 'fail');
        const row = await outboxService.enqueue(ctx, trx, {
          kind: 'summary',
          project_id: projectId,
          revision_id: ordered[0].id,
          recipient_user_id: to.id,
          to_address: to.email,
          to_name: to.name,
          subject: failing ? `FAIL — ${m.subject}` : m.subject,
          text_body: m.text,
          attachment_summary_id: summaries[0].id,
          extra_summary_ids: summaries.slice(1).map((s) => s.id),
          created_by: actor.id,
        });
        messages.push(toMessageInfo(row, ctx.config.PUBLIC_URL));
        for (const r of ordered) {
          const reviewId = await reviewsRepo.receive(trx, { project_id: projectId, revision_id: r.id, reviewer_id: to.id, sent_by: actor.id });
          await trx('reviews').where({ id: reviewId, status: 'received' }).update({ package_id: pkg.id });
          reviewIds.push(reviewId);
        }
      }
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'summary.package-sent',
        subjectType: 'project',
        subjectId: projectId,
        details: { packageId: pkg.id, systems: ordered.map((r) => `${r.system_name} revision ${r.number}`), to: recipients.map((r) => r.email) },
      });
      return { packageId: pkg.id as string, messages, reviews: await reviewsService.byIds(trx, reviewIds) };
    });
  },
};
