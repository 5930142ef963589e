/**
 * Issued summaries: the PDF of an issued revision, made once and kept unchanged, and sending it
 * to inspectors through the outbox.
 *
 * Lifecycle: systemsService.issue writes the summary row (status "pending", with the header
 * frozen) in the issuing transaction and makes the PDF right after the commit (→ "ready", or
 * "failed" with the reason). If the server stops in between, the row stays pending and the first
 * request for the summary makes it. A ready PDF never changes (a trigger refuses it).
 */
import { createHash } from 'node:crypto';
import { readSystemDocument, verdictStatus, type Analysis, type SystemDocument } from '../../src/engine';
import { ServiceError, conflict, invalid, notFound } from './errors';
import { revisionsRepo, systemsRepo, type RevisionRow } from '../repositories/systems';
import { projectsRepo, membersRepo, permitOf } from '../repositories/projects';
import { usersRepo } from '../repositories/users';
import { summariesRepo, type SummaryRow } from '../repositories/summaries';
import { reviewsRepo } from '../repositories/reviews';
import { auditRepo } from '../repositories/audit';
import { iso, type Tx } from '../db/rows';
import { renderSummaryPdf } from '../pdf/summaryPdf';
import { summaryMessage } from '../mail/messages';
import { summaryFileName } from '../mail/worker';
import { withUnit, signed } from '../../src/shared/format/quantity';
import { issueInvitation } from './users';
import { outboxService, toMessageInfo } from './outbox';
import { reviewsService } from './reviews';
import { reviewLoopService } from './reviewLoop';
import { fieldChangesRepo } from '../repositories/fieldChanges';
import type { Actor, ServiceContext } from './context';
import { resultViewPath, type SendSummaryResponse, type SummaryHeader, type SummaryInfo } from '../../src/shared/api/summaries';
import type { SendSummaryBody } from '../../src/shared/api/summaries';
import { log } from '../log';

const apiBase = (projectId: string, systemId: string, revisionId: string) => `/api/projects/${projectId}/systems/${systemId}/revisions/${revisionId}`;

export const toSummaryInfo = (row: SummaryRow, systemId: string): SummaryInfo => ({
  id: row.id,
  revisionId: row.revision_id,
  status: row.status,
  sha256: row.sha256,
  byteLength: row.byte_length,
  pageCount: row.page_count,
  generationMs: row.generation_ms,
  error: row.error,
  createdAt: iso(row.created_at),
  readyAt: row.ready_at ? iso(row.ready_at) : null,
  pdfUrl: `${apiBase(row.project_id, systemId, row.revision_id)}/summary.pdf`,
  fileName: summaryFileName(row.header),
});

/**
 * The verdict in one line, for the e-mail: "PASS: every check is met" only when the status is pass;
 * a failing revision says FAIL first. An incomplete one has no line (it is never sent).
 */
export function verdictLine(a: Analysis): string {
  const status = verdictStatus(a);
  if (status === 'incomplete') throw new Error('an incomplete revision has no verdict line');
  const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId);
  const failures = a.verdict.failures;
  const head = status === 'pass' ? 'PASS: every check is met' : `FAIL: ${failures === 1 ? 'one check is' : `${failures} checks are`} not met`;
  return critical
    ? `${head}; critical fixture ${critical.label}, margin ${signed(critical.margin, a.units.pressure)} ${a.units.pressure} (residual ${withUnit(critical.residual, a.units.pressure)})`
    : head;
}

/** The stored analysis of an issued revision, refused when it cannot back a summary (none, or incomplete). */
function summarisable(revision: RevisionRow): Analysis {
  const stored = revision.analysis;
  if (!stored.ok)
    throw new ServiceError('REVISION_INCOMPLETE', `Revision ${revision.number} has no analysis (${stored.error.message}); it has no summary.`, undefined, {
      reasons: [{ code: 'not-analysed', elementType: 'system', elementId: null, message: stored.error.message }],
    });
  if (verdictStatus(stored.analysis) === 'incomplete') {
    const reasons = stored.analysis.verdict.incomplete?.length
      ? stored.analysis.verdict.incomplete
      : [
          {
            code: 'no-checked-fixtures',
            elementType: 'system',
            elementId: null,
            message: 'No checked fixture: nothing was compared with a minimum flow pressure.',
          },
        ];
    throw new ServiceError(
      'REVISION_INCOMPLETE',
      `Revision ${revision.number} is incomplete; an incomplete revision has no summary and is never sent.`,
      undefined,
      { reasons },
    );
  }
  return stored.analysis;
}

/**
 * An issued revision's document as version 2 for display: a version 1 document is upgraded with
 * 'keep-elevations', which reproduces the elevations its stored analysis was made with (the stored
 * document and analysis are never changed).
 */
function issuedDocument(revision: RevisionRow): SystemDocument {
  const read = readSystemDocument(revision.document, { riseConflict: 'keep-elevations' });
  if (!read.success) throw new Error(`the stored document of revision ${revision.number} cannot be read: ${read.error.issues[0]?.message ?? 'format'}`);
  return read.data;
}

/** The preparer's attestation at issue, as the PDF prints it (null for revisions issued before attestations). */
const attestationOf = (r: RevisionRow) =>
  r.attestation_statement && r.attestation_at
    ? { name: r.attestation_name ?? '', licenceNumber: r.attestation_licence ?? '', statement: r.attestation_statement, at: iso(r.attestation_at) }
    : null;

/** The designer's acknowledgement of a failing verdict, as the PDF prints it. */
const acknowledgementOf = (r: RevisionRow) =>
  r.failure_ack_statement ? { statement: r.failure_ack_statement, by: r.failure_ack_by_name ?? null, at: iso(r.failure_ack_at ?? r.updated_at) } : null;

async function headerFor(trx: Tx, projectId: string, systemId: string, revision: RevisionRow): Promise<SummaryHeader> {
  const [project, system, preparer] = await Promise.all([
    projectsRepo.findById(trx, projectId),
    systemsRepo.find(trx, projectId, systemId),
    revision.issued_by ? usersRepo.findById(trx, revision.issued_by) : Promise.resolve(undefined),
  ]);
  return {
    projectName: project?.name ?? '',
    address: project?.address ?? '',
    codeBasis: project?.code_basis ?? '',
    systemName: system?.name ?? '',
    revisionNumber: revision.number,
    issuedAt: iso(revision.issued_at ?? revision.updated_at),
    preparerName: preparer?.name ?? 'unknown',
    preparerEmail: preparer?.email ?? '',
    inputHash: revision.input_hash ?? '',
    note: revision.note,
    permit: permitOf(project?.permit),
  };
}

async function loadRevision(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string) {
  if (!(await systemsRepo.find(ctx.db, projectId, systemId))) throw notFound('The system');
  const revision = await revisionsRepo.find(ctx.db, systemId, revisionId);
  if (!revision) throw notFound('The revision');
  return revision;
}

export const summariesService = {
  /** In the issuing transaction: the pending summary with its header frozen. */
  async recordIssue(trx: Tx, projectId: string, systemId: string, revisionId: string) {
    const revision = await revisionsRepo.find(trx, systemId, revisionId);
    if (!revision || revision.status === 'draft') throw new Error(`revision ${revisionId} is not issued`);
    await summariesRepo.insertPending(trx, { revision_id: revisionId, project_id: projectId, header: await headerFor(trx, projectId, systemId, revision) });
  },

  /**
   * Makes the PDF of a pending (or failed, when `retry`) summary; a ready one is returned as is.
   * The row lock makes concurrent callers wait for one generation instead of making two.
   */
  async generate(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string, opts: { retry?: boolean } = {}): Promise<SummaryRow> {
    const outcome = await ctx.db.transaction(async (trx) => {
      let row = await summariesRepo.lockByRevision(trx, revisionId);
      if (!row) {
        // an issued revision from before summaries existed (or seeded directly): make its row now
        await this.recordIssue(trx, projectId, systemId, revisionId);
        row = (await summariesRepo.lockByRevision(trx, revisionId))!;
      }
      if (row.status === 'ready' || (row.status === 'failed' && !opts.retry)) return { row, error: null };
      const revision = (await revisionsRepo.find(trx, systemId, revisionId))!;
      try {
        // an incomplete revision (issued before the server refused them) never gets a summary
        const analysis = summarisable(revision);
        const started = performance.now();
        const fieldChange = await fieldChangesRepo.recordForRevision(trx, revisionId);
        const { bytes, pageCount } = await renderSummaryPdf({
          header: row.header,
          document: issuedDocument(revision),
          analysis,
          fieldChange,
          failureAcknowledgement: acknowledgementOf(revision),
          reviewResponses: await reviewLoopService.responsesFor(trx, revisionId, revision.document),
          attestation: attestationOf(revision),
        });
        const pdf = Buffer.from(bytes);
        const sha256 = createHash('sha256').update(pdf).digest('hex');
        await summariesRepo.markReady(trx, row.id, {
          pdf,
          sha256,
          byte_length: pdf.length,
          page_count: pageCount,
          generation_ms: Math.round(performance.now() - started),
        });
        await auditRepo.record(trx, {
          actorId: null,
          projectId,
          action: 'summary.ready',
          subjectType: 'revision',
          subjectId: revisionId,
          details: { sha256, pages: pageCount },
        });
        return { row: (await summariesRepo.findByRevision(trx, revisionId))!, error: null };
      } catch (err) {
        return { row, error: err instanceof Error ? err.message : String(err) };
      }
    });
    if (outcome.error === null) return outcome.row;
    log.error({ revisionId }, `summary of revision ${revisionId} failed: ${outcome.error}`);
    await summariesRepo.markFailed(ctx.db, outcome.row.id, outcome.error);
    return (await summariesRepo.findByRevision(ctx.db, revisionId))!;
  },

  async info(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string): Promise<SummaryInfo> {
    const revision = await loadRevision(ctx, projectId, systemId, revisionId);
    if (revision.status === 'draft') throw notFound('The summary (a draft has none until it is issued)');
    const row = (await summariesRepo.findByRevision(ctx.db, revisionId)) ?? (await this.generate(ctx, projectId, systemId, revisionId));
    return toSummaryInfo(row, systemId);
  },

  async retry(ctx: ServiceContext, actor: Actor, projectId: string, systemId: string, revisionId: string): Promise<SummaryInfo> {
    const revision = await loadRevision(ctx, projectId, systemId, revisionId);
    if (revision.status === 'draft') throw notFound('The summary (a draft has none until it is issued)');
    const current = await summariesRepo.findByRevision(ctx.db, revisionId);
    if (current?.status === 'ready') throw conflict('The summary is ready; an issued summary is never made again.');
    await auditRepo.record(ctx.db, { actorId: actor.id, projectId, action: 'summary.retried', subjectType: 'revision', subjectId: revisionId });
    return toSummaryInfo(await this.generate(ctx, projectId, systemId, revisionId, { retry: true }), systemId);
  },

  /** The PDF bytes; a pending summary is made on the spot. */
  async pdf(ctx: ServiceContext, projectId: string, systemId: string, revisionId: string) {
    const revision = await loadRevision(ctx, projectId, systemId, revisionId);
    if (revision.status === 'draft') throw notFound('The summary (a draft has none until it is issued)');
    let row = await summariesRepo.findByRevision(ctx.db, revisionId);
    if (!row || row.status === 'pending') row = await this.generate(ctx, projectId, systemId, revisionId);
    if (row.status !== 'ready') throw conflict(`The summary could not be made: ${row.error ?? 'unknown reason'}`);
    const bytes = await summariesRepo.pdf(ctx.db, row.id);
    if (!bytes) throw notFound('The summary');
    return { bytes, sha256: row.sha256!, fileName: summaryFileName(row.header) };
  },

  /**
   * Sends the issued summary to inspectors: project members with the inspector role, and outside
   * addresses, which get an inspector account, membership and an invitation link in the same
   * message. One outbox message and one review ("received") per recipient, in one transaction.
   */
  async send(
    ctx: ServiceContext,
    actor: Actor,
    projectId: string,
    systemId: string,
    revisionId: string,
    body: SendSummaryBody & { inspectorIds: string[]; emails: string[] },
  ): Promise<SendSummaryResponse> {
    const revision = await loadRevision(ctx, projectId, systemId, revisionId);
    if (revision.status !== 'issued')
      throw conflict(
        revision.status === 'draft' ? 'Issue the revision before sending it.' : `Revision ${revision.number} is superseded; send the current issued revision.`,
      );
    const analysis = summarisable(revision);
    const failing = verdictStatus(analysis) === 'fail';
    let summary = await summariesRepo.findByRevision(ctx.db, revisionId);
    if (!summary || summary.status === 'pending') summary = await this.generate(ctx, projectId, systemId, revisionId);
    if (summary.status !== 'ready') throw conflict(`The summary could not be made, so it cannot be sent: ${summary.error ?? 'unknown reason'}`);
    const sender = await usersRepo.findById(ctx.db, actor.id);
    const viewUrl = `${ctx.config.PUBLIC_URL.replace(/\/$/, '')}${resultViewPath(projectId, systemId, revisionId)}`;

    return ctx.db.transaction(async (trx) => {
      const recipients = new Map<string, { id: string; email: string; name: string; invitation?: { url: string; expiresAt: string } }>();
      const fields: Record<string, string> = {};
      for (const [i, userId] of body.inspectorIds.entries()) {
        const member = await membersRepo.find(trx, projectId, userId);
        if (!member) fields[`inspectorIds.${i}`] = 'Not a member of this project';
        else if (member.role !== 'inspector') fields[`inspectorIds.${i}`] = `Is a ${member.role} here, not an inspector`;
        else recipients.set(member.userId, { id: member.userId, email: member.email, name: member.name });
      }
      for (const [i, email] of body.emails.entries()) {
        let user = await usersRepo.findByEmail(trx, email);
        if (user?.status === 'disabled') {
          fields[`emails.${i}`] = 'This account is disabled';
          continue;
        }
        const role = user ? await membersRepo.roleOf(trx, projectId, user.id) : undefined;
        if (role && role !== 'inspector') {
          fields[`emails.${i}`] = `Is a ${role} here, not an inspector`;
          continue;
        }
        if (!user) {
          user = await usersRepo.insert(trx, { email, name: email.split('@')[0], is_admin: false, account_role: 'inspector' });
          await auditRepo.record(trx, {
            actorId: actor.id,
            projectId,
            action: 'user.created',
            subjectType: 'user',
            subjectId: user.id,
            details: { email, reason: 'summary sent to an outside address' },
          });
        }
        if (!role) {
          await membersRepo.insert(trx, projectId, user.id, 'inspector');
          await auditRepo.record(trx, {
            actorId: actor.id,
            projectId,
            action: 'member.added',
            subjectType: 'user',
            subjectId: user.id,
            details: { email, role: 'inspector' },
          });
        }
        const invitation = user.status === 'invited' ? await issueInvitation(ctx, trx, user.id, actor, { send: false }) : undefined;
        recipients.set(user.id, { id: user.id, email: user.email, name: user.name, invitation });
      }
      if (Object.keys(fields).length) throw invalid('Some recipients cannot receive this summary.', fields);

      const messages = [];
      const reviewIds: string[] = [];
      for (const r of recipients.values()) {
        const m = summaryMessage({
          header: summary.header,
          recipientName: r.name,
          senderName: sender?.name ?? 'A designer',
          viewUrl,
          verdict: verdictLine(analysis),
          note: body.message,
          invitation: r.invitation,
        });
        const row = await outboxService.enqueue(ctx, trx, {
          kind: 'summary',
          project_id: projectId,
          revision_id: revisionId,
          recipient_user_id: r.id,
          to_address: r.email,
          to_name: r.name,
          // a failing revision says so before anything else, in the subject too
          subject: failing ? `FAIL — ${m.subject}` : m.subject,
          text_body: m.text,
          secret_url: r.invitation?.url ?? null,
          attachment_summary_id: summary.id,
          created_by: actor.id,
        });
        messages.push(toMessageInfo(row, ctx.config.PUBLIC_URL));
        reviewIds.push(await reviewsRepo.receive(trx, { project_id: projectId, revision_id: revisionId, reviewer_id: r.id, sent_by: actor.id }));
      }
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'summary.sent',
        subjectType: 'revision',
        subjectId: revisionId,
        details: { number: revision.number, to: [...recipients.values()].map((r) => r.email), sha256: summary.sha256 },
      });
      return { messages, reviews: await reviewsService.byIds(trx, reviewIds) };
    });
  },
};
