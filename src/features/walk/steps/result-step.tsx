import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import { issueRevisionInputSchema, useIssueRevision } from '../../systems/api/issue-revision';
import { VerdictMark, verdictOf } from '../../systems/components/verdict-mark';
import { useWalk } from '../draft/walk-context';
import { RevisionSummaryPanel } from '../../summaries/components/revision-summary-panel';
import { StepIntro } from '../components/cells';
import { criticalLedger, LedgerTable } from '../components/ledger-panel';
import { PressureProfileChart } from '../components/pressure-profile';
import { WarningList } from '../components/warning-list';
import { CAUTIONS } from '../cautions';
import { fmt, signed } from '../lib/format';

function IssueForm() {
  const { ids, draft, live } = useWalk();
  const issue = useIssueRevision();
  const [preparing, setPreparing] = useState(false);
  const form = useForm({ resolver: zodResolver(issueRevisionInputSchema), defaultValues: { note: '' } });
  const onSubmit = form.handleSubmit(async ({ note }) => {
    setPreparing(true);
    const version = await draft.versionToIssue();
    setPreparing(false);
    if (version === null) return;
    issue.mutate({ ...ids, version, note });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Issue this revision">
      <p className="max-w-prose text-sm">
        Issuing freezes this revision — its document, its analysis, the engine version and a hash of the inputs. It can
        then be read and compared but never changed; later changes go into a new draft started from it.
      </p>
      <TextAreaField label="Note for this revision (optional)" hint="For example what changed, or who it is for." error={form.formState.errors.note?.message} {...form.register('note')} />
      <div>
        <Button type="submit" pending={issue.isPending || preparing} pendingLabel="Issuing…" disabled={!live.ok || draft.state === 'conflict'}>
          Issue revision
        </Button>
      </div>
      {!live.ok ? <p className="text-sm text-fault">A revision that cannot be computed cannot be issued.</p> : null}
      <div aria-live="assertive">
        {issue.isError ? (
          <Alert tone="fault" title="Not issued">
            {errorMessage(issue.error)}
          </Alert>
        ) : null}
      </div>
    </form>
  );
}

export function ResultStep() {
  const { live, units, revision, readOnlyReason, project, document, ids } = useWalk();
  if (!live.ok) {
    return (
      <div>
        <StepIntro title="Result" />
        <Alert tone="fault" title="The system cannot be computed yet">
          {live.message}
          {live.element ? ` (at ${live.element})` : ''}
        </Alert>
      </div>
    );
  }
  const a = live.analysis;
  const ledger = criticalLedger(a);
  const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId);
  const nodeName = new Map(document.nodes.map((n) => [n.id, n.label || n.id]));
  const allPass = a.verdict.allFixturesPass && a.verdict.allVelocitiesPass && a.verdict.allStaticPass;
  const fastSegments = a.segments.filter((s) => s.velocityPass === false);
  const staticNodes = a.nodes.filter((n) => n.staticPass !== null);
  const overStatic = staticNodes.filter((n) => n.staticPass === false);

  return (
    <div className="flex flex-col gap-6">
      <StepIntro title="Result" />
      <div className="rounded-lg border-2 border-rule bg-surface p-4" data-testid="overall-verdict">
        <p className="flex flex-wrap items-center gap-3 text-xl">
          <VerdictMark verdict={verdictOf(allPass)}>{allPass ? 'Every check passes' : `${a.verdict.failures} check(s) fail`}</VerdictMark>
        </p>
        <p className="mt-1 text-sm text-ink-soft">
          Fixtures {a.verdict.allFixturesPass ? 'pass' : 'FAIL'} · velocities {a.verdict.allVelocitiesPass ? 'pass' : 'FAIL'} · static pressure{' '}
          {a.verdict.allStaticPass ? 'passes' : 'FAILS'} · engine {a.engineVersion}
        </p>
      </div>

      <Section title="Every checked fixture" headingLevel={3}>
        {a.fixtures.length === 0 ? (
          <p className="text-ink-soft">No checked fixtures: add them at the step Remote fixture.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="verdict-table">
              <caption className="sr-only">Residual pressure, required pressure and margin of every checked fixture</caption>
              <thead>
                <tr className="border-b-2 border-rule text-left">
                  <th scope="col" className="py-1 pr-3">Fixture</th>
                  <th scope="col" className="py-1 pr-3">Node</th>
                  <th scope="col" className="py-1 pr-3 text-right">Residual ({units.pressure})</th>
                  <th scope="col" className="py-1 pr-3 text-right">Required ({units.pressure})</th>
                  <th scope="col" className="py-1 pr-3 text-right">Margin ({units.pressure})</th>
                  <th scope="col" className="py-1">Verdict</th>
                </tr>
              </thead>
              <tbody>
                {[...a.fixtures].sort((x, y) => x.margin - y.margin).map((f) => (
                  <tr key={f.id} className="border-b border-rule" data-testid={`verdict-${f.id}`}>
                    <th scope="row" className="py-1 pr-3 text-left font-normal">
                      {f.label}
                      {f.id === a.criticalFixtureId ? <strong className="ml-2">◆ critical</strong> : null}
                    </th>
                    <td className="py-1 pr-3">{nodeName.get(f.nodeId)}</td>
                    <td className="py-1 pr-3 text-right tabular-nums">{fmt(f.residual, 2)}</td>
                    <td className="py-1 pr-3 text-right tabular-nums">{fmt(f.required, 2)}</td>
                    <td className="py-1 pr-3 text-right tabular-nums" data-testid={`margin-${f.id}`}>{signed(f.margin, 2)}</td>
                    <td className="py-1"><VerdictMark verdict={verdictOf(f.pass)} /></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Section>

      {ledger && critical ? (
        <>
          <Section title={`Pressure ledger to the critical fixture: ${critical.label}`} headingLevel={3}>
            <LedgerTable ledger={ledger} caption={`Pressure ledger to ${critical.label}`} />
          </Section>
          <Section title="Pressure along the critical path" headingLevel={3}>
            <PressureProfileChart analysis={a} ledger={ledger} fixtureLabel={critical.label} />
          </Section>
        </>
      ) : null}

      <Section title="Velocity and static pressure" headingLevel={3}>
        <div className="flex flex-col gap-2 text-sm">
          <p data-testid="velocity-check">
            <VerdictMark verdict={verdictOf(a.verdict.allVelocitiesPass)}>Velocity</VerdictMark>{' '}
            {fastSegments.length === 0
              ? `Every segment is within its velocity limit (highest ${fmt(Math.max(0, ...a.segments.map((s) => s.velocity)), 2)} ${units.velocity}).`
              : `${fastSegments.length} segment(s) are above the limit: ${fastSegments.map((s) => `${s.label ?? s.id} ${fmt(s.velocity, 2)} > ${fmt(s.velocityLimit, 2)} ${units.velocity}`).join('; ')}.`}
          </p>
          <p data-testid="static-check">
            <VerdictMark verdict={verdictOf(a.verdict.allStaticPass)}>Static pressure</VerdictMark>{' '}
            {overStatic.length === 0
              ? `The highest static pressure at a node serving fixtures is ${fmt(Math.max(0, ...staticNodes.map((n) => n.staticPressureHigh)), 1)} ${units.pressure}, within the maximum of ${fmt(a.criteria.maxStaticPressure, 1)} ${units.pressure}.`
              : `${overStatic.length} node(s) are above the maximum static pressure of ${fmt(a.criteria.maxStaticPressure, 1)} ${units.pressure}: ${overStatic.map((n) => `${n.label ?? n.id} ${fmt(n.staticPressureHigh, 1)}`).join('; ')}. A pressure-reducing valve is likely needed.`}
          </p>
          <p className="text-ink-soft">Methods: {a.methods.friction.label}; fittings {a.methods.fittings.label}; demand {a.methods.demand.label}.</p>
        </div>
      </Section>

      <Section title="Warnings" headingLevel={3}>
        <WarningList title={`${a.warnings.length} warning(s) in plain words`} warnings={a.warnings} empty="No warnings." />
      </Section>

      <Section title="Cautions" headingLevel={3}>
        <div className="max-w-prose text-sm" data-testid="cautions">
          {CAUTIONS.map((c) => (
            <p key={c} className="mb-2">{c}</p>
          ))}
        </div>
      </Section>

      <Section title="Issue" headingLevel={3}>
        {revision.status !== 'draft' ? (
          <p data-testid="issued-note">
            Revision {revision.number} was issued{revision.issuedAt ? ` on ${formatDateTime(revision.issuedAt)}` : ''}
            {revision.issuedBy ? ` by ${revision.issuedBy}` : ''}. It is {revision.status} and never changes.
          </p>
        ) : readOnlyReason || project.myRole !== 'designer' ? (
          <p>Only the project’s designers issue revisions.</p>
        ) : (
          <IssueForm />
        )}
      </Section>
      <RevisionSummaryPanel {...ids} revisionStatus={revision.status} myRole={project.myRole} />
    </div>
  );
}
