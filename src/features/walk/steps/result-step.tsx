import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import { Link } from 'react-router-dom';
import { verdictStatus } from '../../../engine';
import type { IncompleteReason } from '../../../engine';
import { incompleteReasonsOf, issueRevisionInputSchema, useIssueRevision } from '../../systems/api/issue-revision';
import { systemUrls } from '../../systems/api/urls';
import { fixtureVerdict, VerdictMark } from '../../systems/components/verdict-mark';
import { WALK_STEPS } from '../steps';
import type { WalkStepId } from '../steps';
import { liveStatus, plural, stepOfReason } from '../lib/verdict';
import { useWalk } from '../draft/walk-context';
import { RevisionSummaryPanel } from '../../summaries/components/revision-summary-panel';
import { StepIntro } from '../components/cells';
import { AttestationFields, attestationOf, EMPTY_ATTESTATION, type AttestationDraft } from '../components/attestation-fields';
import { criticalLedger, LedgerTable } from '../components/ledger-panel';
import { PressureProfileChart } from '../components/pressure-profile';
import { WarningList } from '../components/warning-list';
import { CAUTIONS } from '../cautions';
import { num, signed } from '../../../shared/format/quantity';
import { SizingPanel } from '../../sizing/components/sizing-panel';
import { ZonesTable } from '../components/zones-table';
import { ExpansionTankSection } from '../components/expansion-tank-section';
import { RecirculationSection } from '../components/recirculation-section';

const STATEMENT_MIN = 20;

/**
 * Issue, asked once. An incomplete revision cannot be issued (the button is disabled and the
 * reasons say why); a failing one only with the designer's acknowledgement statement, which the
 * server records with the revision.
 */
function IssueForm() {
  const { ids, draft, live, revision, links } = useWalk();
  const issue = useIssueRevision();
  const [preparing, setPreparing] = useState(false);
  const [confirming, setConfirming] = useState<{ note: string } | null>(null);
  const [statement, setStatement] = useState('');
  const [attestationDraft, setAttestationDraft] = useState<AttestationDraft>(EMPTY_ATTESTATION);
  const attestation = attestationOf(attestationDraft);
  const form = useForm({ resolver: zodResolver(issueRevisionInputSchema), defaultValues: { note: '' } });
  const status = liveStatus(live);
  const reasons = live.ok ? (live.analysis.verdict.incomplete ?? []) : [];
  const blocked = !live.ok || status === 'incomplete' || draft.state === 'conflict';
  const statementShort = status === 'fail' && statement.trim().length < STATEMENT_MIN;
  const onSubmit = form.handleSubmit(({ note }) => {
    issue.reset();
    setConfirming({ note: note ?? '' });
  });
  const confirm = async () => {
    if (!confirming || statementShort || !attestation) return;
    setPreparing(true);
    const version = await draft.versionToIssue();
    setPreparing(false);
    if (version === null) return;
    issue.mutate(
      { ...ids, version, note: confirming.note, attestation, ...(status === 'fail' ? { acknowledgeFailure: { statement } } : {}) },
      { onSettled: () => setConfirming(null) },
    );
  };
  const serverReasons = incompleteReasonsOf(issue.error);
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Issue this revision">
      <p className="max-w-prose text-sm">
        Issuing freezes this revision — its document, its analysis, the engine version and a hash of the inputs. It can then be read and compared but never
        changed; later changes go into a new draft started from it.
      </p>
      <TextAreaField
        label="Note for this revision (optional)"
        hint="For example what changed, or who it is for."
        error={form.formState.errors.note?.message}
        readOnly={confirming !== null}
        {...form.register('note')}
      />
      {confirming ? (
        <div className="flex flex-col gap-3 rounded-md border-2 border-standpipe bg-standpipe-soft p-3" role="group" aria-label="Confirm issuing">
          <p className="font-semibold">
            Issue revision {revision.number}
            {status === 'fail' ? ' although it fails' : ''}? It never changes once issued.
          </p>
          {status === 'fail' ? (
            <TextAreaField
              label="Your statement: why this failing revision is issued"
              hint={`Recorded with the revision and printed on its summary. At least ${STATEMENT_MIN} characters, e.g. which check fails and what is being done about it.`}
              value={statement}
              onChange={(ev) => setStatement(ev.target.value)}
              error={statementShort && statement.length > 0 ? `At least ${STATEMENT_MIN} characters` : undefined}
            />
          ) : null}
          <AttestationFields value={attestationDraft} onChange={setAttestationDraft} disabled={issue.isPending || preparing} />
          <div className="flex flex-wrap gap-3">
            <Button
              onClick={() => void confirm()}
              pending={issue.isPending || preparing}
              pendingLabel="Issuing…"
              disabled={statementShort || blocked || !attestation}
            >
              {status === 'fail' ? `Yes, issue failing revision ${revision.number}` : `Yes, issue revision ${revision.number}`}
            </Button>
            <Button variant="secondary" onClick={() => setConfirming(null)} disabled={issue.isPending || preparing}>
              Not now
            </Button>
          </div>
        </div>
      ) : (
        <div>
          <Button type="submit" disabled={blocked} aria-describedby={status === 'incomplete' ? 'issue-blocked' : undefined}>
            Issue revision…
          </Button>
        </div>
      )}
      {!live.ok ? <p className="text-sm text-fault">A revision that cannot be computed cannot be issued.</p> : null}
      {live.ok && status === 'incomplete' ? (
        <div id="issue-blocked" className="text-sm" data-testid="issue-blocked">
          <p className="font-semibold text-caution">An incomplete revision cannot be issued. Still missing:</p>
          <ul className="mt-1 list-disc pl-5">
            {reasons.map((r, i) => (
              <li key={`${r.code}-${r.elementId ?? ''}-${i}`}>
                {r.message} <Link to={links.step(stepOfReason(r))}>Fix at {stepLabel(stepOfReason(r))}</Link>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <div aria-live="assertive">
        {issue.isError ? (
          <Alert tone="fault" title="Not issued">
            {errorMessage(issue.error)}
            {serverReasons.length ? (
              <ul className="mt-2 list-disc pl-5" data-testid="issue-refused-reasons">
                {serverReasons.map((r) => (
                  <li key={r}>{r}</li>
                ))}
              </ul>
            ) : null}
          </Alert>
        ) : null}
      </div>
    </form>
  );
}

const stepLabel = (id: WalkStepId) => WALK_STEPS.find((s) => s.id === id)?.label ?? id;

/** What is missing before Headroom can say pass or fail, each with a link to the step that fixes it. */
function IncompleteList({ reasons }: { reasons: IncompleteReason[] }) {
  const { links } = useWalk();
  return (
    <ul className="mt-2 flex flex-col gap-1 text-sm" data-testid="incomplete-reasons">
      {reasons.map((r, i) => {
        const step = stepOfReason(r);
        return (
          <li key={`${r.code}-${r.elementId ?? ''}-${i}`} data-code={r.code}>
            <span aria-hidden="true">○ </span>
            {r.message} <Link to={links.step(step)}>Fix at {stepLabel(step)}</Link>
          </li>
        );
      })}
    </ul>
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
  const status = verdictStatus(a);
  const reasons = a.verdict.incomplete ?? [];
  const fastSegments = a.segments.filter((s) => s.velocityPass === false);
  const staticNodes = a.nodes.filter((n) => n.staticPass !== null);
  const overStatic = staticNodes.filter((n) => n.staticPass === false);

  return (
    <div className="flex flex-col gap-6">
      <StepIntro title="Result" />
      <div className="rounded-lg border-2 border-rule bg-surface p-4" data-testid="overall-verdict">
        <p className="flex flex-wrap items-center gap-3 text-xl">
          <VerdictMark verdict={status}>
            {status === 'pass'
              ? 'Every check passes'
              : status === 'fail'
                ? `${plural(a.verdict.failures, 'check')} ${a.verdict.failures === 1 ? 'fails' : 'fail'}`
                : `Incomplete: ${plural(reasons.length, 'item')} missing before Headroom can say pass or fail`}
          </VerdictMark>
        </p>
        {status === 'incomplete' ? <IncompleteList reasons={reasons} /> : null}
        {status === 'incomplete' && a.verdict.failures > 0 ? (
          <p className="mt-2 text-sm text-fault">
            On the description as it is, {plural(a.verdict.failures, 'check')} already {a.verdict.failures === 1 ? 'fails' : 'fail'}.
          </p>
        ) : null}
        <p className="mt-1 text-sm text-ink-soft">
          {status === 'incomplete' ? (
            // an incomplete description has not been checked: no "pass" words under it
            <>Not checked until the missing items are entered · engine {a.engineVersion}</>
          ) : (
            <>
              Fixtures {a.verdict.allFixturesPass ? 'pass' : 'FAIL'} · velocities {a.verdict.allVelocitiesPass ? 'pass' : 'FAIL'} · static pressure{' '}
              {a.verdict.allStaticPass ? 'passes' : 'FAILS'} · engine {a.engineVersion}
            </>
          )}
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
                  <th scope="col" className="py-1 pr-3">
                    Fixture
                  </th>
                  <th scope="col" className="py-1 pr-3">
                    Node
                  </th>
                  <th scope="col" className="py-1 pr-3 text-right">
                    Residual ({units.pressure})
                  </th>
                  <th scope="col" className="py-1 pr-3 text-right">
                    Required ({units.pressure})
                  </th>
                  <th scope="col" className="py-1 pr-3 text-right">
                    Margin ({units.pressure})
                  </th>
                  <th scope="col" className="py-1">
                    Verdict
                  </th>
                </tr>
              </thead>
              <tbody>
                {[...a.fixtures]
                  .sort((x, y) => x.margin - y.margin)
                  .map((f) => (
                    <tr key={f.id} className="border-b border-rule" data-testid={`verdict-${f.id}`}>
                      <th scope="row" className="py-1 pr-3 text-left font-normal">
                        {f.label}
                        {f.id === a.criticalFixtureId ? <strong className="ml-2">◆ critical</strong> : null}
                      </th>
                      <td className="py-1 pr-3">{nodeName.get(f.nodeId)}</td>
                      <td className="py-1 pr-3 text-right tabular-nums">{num(f.residual, units.pressure)}</td>
                      <td className="py-1 pr-3 text-right tabular-nums">{num(f.required, units.pressure)}</td>
                      <td className="py-1 pr-3 text-right tabular-nums" data-testid={`margin-${f.id}`}>
                        {signed(f.margin, units.pressure)}
                      </td>
                      <td className="py-1">
                        <VerdictMark verdict={fixtureVerdict(f.pass, status)} />
                      </td>
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
            <VerdictMark verdict={fixtureVerdict(a.verdict.allVelocitiesPass, status)}>Velocity</VerdictMark>{' '}
            {fastSegments.length === 0
              ? `Every segment is within its velocity limit (highest ${num(Math.max(0, ...a.segments.map((s) => s.velocity)), units.velocity)} ${units.velocity}).`
              : `${plural(fastSegments.length, 'segment')} ${fastSegments.length === 1 ? 'is' : 'are'} above the limit: ${fastSegments.map((s) => `${s.label ?? s.id} ${num(s.velocity, units.velocity)} > ${num(s.velocityLimit, units.velocity)} ${units.velocity}`).join('; ')}.`}
          </p>
          <p data-testid="static-check">
            <VerdictMark verdict={fixtureVerdict(a.verdict.allStaticPass, status)}>Static pressure</VerdictMark>{' '}
            {overStatic.length === 0
              ? `The highest static pressure at a node serving fixtures is ${num(Math.max(0, ...staticNodes.map((n) => n.staticPressureHigh)), units.pressure)} ${units.pressure}, within the maximum of ${num(a.criteria.maxStaticPressure, units.pressure)} ${units.pressure}.`
              : `${plural(overStatic.length, 'node')} ${overStatic.length === 1 ? 'is' : 'are'} above the maximum static pressure of ${num(a.criteria.maxStaticPressure, units.pressure)} ${units.pressure}: ${overStatic.map((n) => `${n.label ?? n.id} ${num(n.staticPressureHigh, units.pressure)}`).join('; ')}. A pressure-reducing valve is likely needed.`}
          </p>
          <p className="text-ink-soft">
            Methods: {a.methods.friction.label}; fittings {a.methods.fittings.label}; demand {a.methods.demand.label}.
          </p>
        </div>
      </Section>

      <Section title="Zones" headingLevel={3}>
        <ZonesTable analysis={a} />
      </Section>

      {status !== 'incomplete' ? (
        <Section title="Automatic sizing" headingLevel={3}>
          <SizingPanel />
        </Section>
      ) : null}

      {document.service === 'hot' ? <ExpansionTankSection /> : null}
      {document.service === 'hot' ? <RecirculationSection /> : null}

      <Section title="Export for the report" headingLevel={3}>
        <ResultExports />
      </Section>

      <Section title="Warnings" headingLevel={3}>
        <WarningList title={`${plural(a.warnings.length, 'warning')} in plain words`} warnings={a.warnings} empty="No warnings." />
      </Section>

      <Section title="Cautions" headingLevel={3}>
        <div className="max-w-prose text-sm" data-testid="cautions">
          {CAUTIONS.map((c) => (
            <p key={c} className="mb-2">
              {c}
            </p>
          ))}
        </div>
      </Section>

      <Section title="Issue" headingLevel={3}>
        {revision.status !== 'draft' ? (
          <>
            <p data-testid="issued-note">
              Revision {revision.number} was issued{revision.issuedAt ? ` on ${formatDateTime(revision.issuedAt)}` : ''}
              {revision.issuedBy ? ` by ${revision.issuedBy}` : ''}. It is {revision.status} and never changes.
            </p>
            <p className="text-sm text-ink-soft" data-testid="issued-engine">
              Its stored analysis, in the summary and the downloads, was made with Headroom engine {revision.engineVersion}; the figures on these pages are
              recomputed in your browser with engine {live.analysis.engineVersion}.
            </p>
            {revision.attestation ? (
              <p className="text-sm" data-testid="issued-attestation">
                Attested by {revision.attestation.name}, licence or registration no. {revision.attestation.licenceNumber}, on{' '}
                {formatDateTime(revision.attestation.at)}: “{revision.attestation.statement}”
              </p>
            ) : null}
          </>
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

/** Downloads of the stored result (the revision as last saved; an issued one as issued): each table as CSV, or all in one workbook. */
function ResultExports() {
  const { ids, revision, draft } = useWalk();
  const csv = (table: 'segments' | 'fixtures' | 'ledgers') => systemUrls.exportCsv(ids.projectId, ids.systemId, ids.revisionId, table);
  return (
    <div className="flex flex-col gap-2 text-sm" data-testid="result-exports">
      <p className="text-ink-soft">
        The segment table (with friction and fitting losses), every checked fixture and every fixture’s pressure ledger, in the project’s units, with the
        verdict on the first line.
        {revision.status === 'draft' ? ' They hold the draft as last saved.' : ` They hold revision ${revision.number} as issued.`}
      </p>
      {revision.status === 'draft' && draft.state !== 'saved' ? (
        <p className="text-ink-soft">A change is being saved: download once it shows “All changes saved”.</p>
      ) : null}
      <p className="flex flex-wrap gap-4">
        <a href={systemUrls.exportXlsx(ids.projectId, ids.systemId, ids.revisionId)} download>
          All tables as a spreadsheet (.xlsx)
        </a>
        <a href={csv('segments')} download>
          Segments (CSV)
        </a>
        <a href={csv('fixtures')} download>
          Checked fixtures (CSV)
        </a>
        <a href={csv('ledgers')} download>
          Pressure ledgers (CSV)
        </a>
      </p>
    </div>
  );
}
