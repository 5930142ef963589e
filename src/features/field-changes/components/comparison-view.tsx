import { Alert } from '../../../components/ui/alert';
import { Section } from '../../../components/ui/card';
import type { ComparisonResponse } from '../../../shared/api/fieldChanges';
import { fixtureVerdict, VerdictMark, verdictOf } from '../../systems/components/verdict-mark';
import type { Verdict } from '../../systems/components/verdict-mark';

type Status = 'pass' | 'fail' | 'incomplete';
/** The proposed document's verdict status when the server sends it (pass / fail / incomplete); else the pass flag. */
function statusOf(comparison: ComparisonResponse): Status | null {
  const status = (comparison.verdict as { status?: unknown }).status;
  return status === 'pass' || status === 'fail' || status === 'incomplete' ? status : null;
}
const CHANGE_WORDS: Record<Verdict, string> = { pass: 'Still passes', fail: 'Fails', incomplete: 'Incomplete', unknown: 'Not computed' };
import { num, signed } from '../../../shared/format/quantity';

type Props = { comparison: ComparisonResponse };

/** The overall verdict in one sentence, by word and shape. */
export function ComparisonVerdict({ comparison }: Props) {
  const { verdict } = comparison;
  const mark: Verdict = statusOf(comparison) ?? verdictOf(verdict.pass);
  return (
    <div className="rounded-md border-2 border-rule p-4" data-testid="field-change-verdict" data-pass={String(verdict.pass)} data-status={mark}>
      <VerdictMark verdict={mark}>{CHANGE_WORDS[mark]}</VerdictMark>
      <p className="mt-1 text-lg">{verdict.sentence}</p>
    </div>
  );
}

/** Every checked fixture: the issued margin, the new margin and the difference. */
export function FixtureEffectTable({ comparison }: Props) {
  const u = comparison.units.pressure;
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[44rem] text-sm" data-testid="fixture-effect-table">
        <caption className="mb-2 text-left text-ink-soft">Margin = residual pressure − the fixture’s minimum flow pressure, at the design flow ({u}).</caption>
        <thead>
          <tr className="border-b-2 border-rule text-left">
            <th scope="col" className="py-1 pr-2">
              Fixture
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              Required
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              Issued residual
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              New residual
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              Issued margin
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              New margin
            </th>
            <th scope="col" className="py-1 pr-2 text-right">
              Difference
            </th>
            <th scope="col" className="py-1">
              With the change
            </th>
          </tr>
        </thead>
        <tbody>
          {comparison.fixtures.map((f) => (
            <tr
              key={f.id}
              className="border-b border-rule"
              data-testid={`fixture-effect-${f.id}`}
              data-critical={f.id === comparison.verdict.criticalFixtureId || undefined}
            >
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                {f.label}
                {f.id === comparison.verdict.criticalFixtureId ? <span className="ml-1 text-xs font-semibold">(critical)</span> : null}
              </th>
              <td className="py-1 pr-2 text-right tabular-nums">{num(f.required, u)}</td>
              <td className="py-1 pr-2 text-right tabular-nums">{num(f.issuedResidual, u)}</td>
              <td className="py-1 pr-2 text-right tabular-nums">{num(f.newResidual, u)}</td>
              <td className="py-1 pr-2 text-right tabular-nums">{signed(f.issuedMargin, u)}</td>
              <td className="py-1 pr-2 text-right tabular-nums" data-testid="new-margin">
                {signed(f.newMargin, u)}
              </td>
              <td className="py-1 pr-2 text-right tabular-nums" data-testid="margin-difference">
                {signed(f.difference, u)}
              </td>
              <td className="py-1">
                <VerdictMark verdict={fixtureVerdict(f.newPass, statusOf(comparison))} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function changeWords(changes: ComparisonResponse['segments'][number]['changes']) {
  return changes.map((c) => `${c.field}: ${c.before ?? 'none'} → ${c.after ?? 'none'}`).join('; ');
}

/** Each changed segment and device: what changed and its effect on loss (and velocity). */
export function ChangedElements({ comparison }: Props) {
  const { units } = comparison;
  if (comparison.segments.length === 0 && comparison.devices.length === 0) {
    return <p className="text-ink-soft">Nothing differs from the issued revision yet.</p>;
  }
  return (
    <div className="flex flex-col gap-4">
      {comparison.segments.length ? (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[44rem] text-sm" data-testid="segment-effect-table">
            <caption className="mb-2 text-left font-semibold">Changed segments (loss = friction + fittings of the segment, {units.pressure})</caption>
            <thead>
              <tr className="border-b-2 border-rule text-left">
                <th scope="col" className="py-1 pr-2">
                  Segment
                </th>
                <th scope="col" className="py-1 pr-2">
                  What changed
                </th>
                <th scope="col" className="py-1 pr-2 text-right">
                  Loss issued → new
                </th>
                <th scope="col" className="py-1 pr-2 text-right">
                  Difference
                </th>
                <th scope="col" className="py-1 text-right">
                  Velocity ({units.velocity})
                </th>
              </tr>
            </thead>
            <tbody>
              {comparison.segments.map((s) => (
                <tr key={s.id} className="border-b border-rule align-top" data-testid={`segment-effect-${s.id}`}>
                  <th scope="row" className="py-1 pr-2 text-left font-normal">
                    {s.label}
                  </th>
                  <td className="py-1 pr-2">{changeWords(s.changes)}</td>
                  <td className="py-1 pr-2 text-right tabular-nums">
                    {num(s.issued?.loss, units.pressure)} → {num(s.proposed?.loss, units.pressure)}
                  </td>
                  <td className="py-1 pr-2 text-right tabular-nums">{signed(s.lossDifference, units.pressure)}</td>
                  <td className="py-1 text-right tabular-nums">
                    {num(s.issued?.velocity, units.velocity)} → {num(s.proposed?.velocity, units.velocity)}
                    {s.proposed?.velocityPass === false ? <span className="block text-xs font-semibold text-fault">⚠ over the limit</span> : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {comparison.devices.length ? (
        <table className="w-full text-sm" data-testid="device-effect-table">
          <caption className="mb-2 text-left font-semibold">Changed devices ({units.pressure})</caption>
          <thead>
            <tr className="border-b-2 border-rule text-left">
              <th scope="col" className="py-1 pr-2">
                Device
              </th>
              <th scope="col" className="py-1 pr-2">
                What changed
              </th>
              <th scope="col" className="py-1 pr-2 text-right">
                Loss issued → new
              </th>
              <th scope="col" className="py-1 text-right">
                Difference
              </th>
            </tr>
          </thead>
          <tbody>
            {comparison.devices.map((d) => (
              <tr key={d.id} className="border-b border-rule align-top">
                <th scope="row" className="py-1 pr-2 text-left font-normal">
                  {d.label} <span className="text-xs">({d.change})</span>
                </th>
                <td className="py-1 pr-2">{changeWords(d.changes)}</td>
                <td className="py-1 pr-2 text-right tabular-nums">
                  {num(d.issuedLoss, units.pressure)} → {num(d.newLoss, units.pressure)}
                </td>
                <td className="py-1 text-right tabular-nums">{signed(d.lossDifference, units.pressure)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
    </div>
  );
}

/** Warnings the change brings, and those it clears. */
export function WarningChanges({ comparison }: Props) {
  if (comparison.newWarnings.length === 0 && comparison.resolvedWarnings.length === 0)
    return <p className="text-ink-soft">No warning appears or goes away with the change.</p>;
  return (
    <div className="flex flex-col gap-3">
      {comparison.newWarnings.length ? (
        <div data-testid="new-warnings">
          <h4 className="font-semibold">New with the change</h4>
          <ul className="list-disc pl-5">
            {comparison.newWarnings.map((w, i) => (
              <li key={`${w.code}-${w.elementId}-${i}`}>
                <span aria-hidden="true">⚠ </span>
                {w.message}
                {w.detail ? <span className="text-ink-soft"> — {w.detail}</span> : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {comparison.resolvedWarnings.length ? (
        <div>
          <h4 className="font-semibold">Cleared by the change</h4>
          <ul className="list-disc pl-5">
            {comparison.resolvedWarnings.map((w, i) => (
              <li key={`${w.code}-${w.elementId}-${i}`}>{w.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}

export function ComparisonSections({ comparison }: Props) {
  if (!comparison.proposed.ok) {
    return (
      <Alert tone="fault" title="The field change cannot be computed">
        {comparison.proposed.error}
      </Alert>
    );
  }
  return (
    <div className="flex flex-col gap-6">
      <ComparisonVerdict comparison={comparison} />
      <Section title="Effect at every checked fixture" headingLevel={3}>
        <FixtureEffectTable comparison={comparison} />
      </Section>
      <Section title="What changed" headingLevel={3}>
        <ChangedElements comparison={comparison} />
      </Section>
      <Section title="Warnings" headingLevel={3}>
        <WarningChanges comparison={comparison} />
      </Section>
    </div>
  );
}
