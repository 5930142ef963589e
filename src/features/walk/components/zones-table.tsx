import type { Analysis, ZoneResult } from '../../../engine';
import { zoneFloorsWords, zoneVerdictWords } from '../../../shared/format/zoneWords';
import { VerdictMark, type Verdict } from '../../systems/components/verdict-mark';
import { num, signed } from '../../../shared/format/quantity';

/** A zone's mark: 'not-checked' shows as "not computed" (grey, dashed), never green. */
export function zoneVerdict(z: ZoneResult): Verdict {
  return z.status === 'not-checked' ? 'unknown' : z.status;
}

/**
 * The pressure zones of the result: the part fed from the supply and each part fed through a PRV
 * or a booster (analysis/zones.ts), with their pressures, static check, critical fixture and verdict.
 * Analyses stored before zones existed carry none: the section says so instead of guessing.
 */
export function ZonesTable({ analysis }: { analysis: Analysis }) {
  const u = analysis.units;
  const zones = analysis.zones;
  if (!zones) return <p className="text-sm text-ink-soft">This analysis was stored before Headroom reported zones; a new draft computes them.</p>;
  const byId = new Map(zones.map((z) => [z.id, z]));
  return (
    <div className="flex flex-col gap-2">
      <p className="max-w-prose text-sm text-ink-soft">
        A zone is the part of the system fed from the supply, or through one pressure-reducing valve or booster pump at its own setting.
        {zones.length === 1 ? ' This system has no PRV or booster: one zone.' : ` This system has ${zones.length} zones.`}
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="zones-table">
          <caption className="sr-only">Pressure zones: feed, floors, pressures, static check, critical fixture and verdict</caption>
          <thead>
            <tr className="border-b-2 border-rule text-left align-bottom">
              <th scope="col" className="py-1 pr-3">
                Zone
              </th>
              <th scope="col" className="py-1 pr-3">
                Fed by
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Setting ({u.pressure})
              </th>
              <th scope="col" className="py-1 pr-3">
                Floors
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Highest residual ({u.pressure})
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Lowest residual ({u.pressure})
              </th>
              <th scope="col" className="py-1 pr-3">
                Highest static ({u.pressure})
              </th>
              <th scope="col" className="py-1 pr-3">
                Critical fixture, margin ({u.pressure})
              </th>
              {/* room for the verdict's words beside the ledger (the table scrolls sideways before this column squeezes) */}
              <th scope="col" className="min-w-[10rem] py-1">
                Verdict
              </th>
            </tr>
          </thead>
          <tbody>
            {zones.map((z) => (
              <tr key={z.id} className="border-b border-rule align-top" data-testid={`zone-${z.index}`}>
                <th scope="row" className="py-1 pr-3 text-left font-semibold">
                  {z.name}
                  {z.parentZoneId && z.parentZoneId !== 'supply' ? (
                    <span className="block text-xs font-normal text-ink-soft">inside {byId.get(z.parentZoneId)?.name.split(' — ')[0]}</span>
                  ) : null}
                </th>
                <td className="py-1 pr-3">
                  {z.feed.kind === 'supply' ? 'The supply' : z.feed.deviceLabel}
                  {z.feed.kind !== 'supply' ? (
                    <span className="block text-xs text-ink-soft">{z.feed.kind === 'prv' ? 'pressure-reducing valve' : 'booster pump'}</span>
                  ) : null}
                </td>
                <td className="py-1 pr-3 text-right tabular-nums">
                  {z.feed.pressure === null ? '—' : `${z.feed.setting === 'gain' ? 'gain ' : ''}${num(z.feed.pressure, u.pressure)}`}
                </td>
                <td className="py-1 pr-3">{zoneFloorsWords(z, u.elevation)}</td>
                <td className="py-1 pr-3 text-right tabular-nums">
                  {z.highestResidual ? (
                    <>
                      {num(z.highestResidual.pressure, u.pressure)}
                      <span className="block text-xs text-ink-soft">{z.highestResidual.where}</span>
                    </>
                  ) : (
                    '—'
                  )}
                </td>
                <td className="py-1 pr-3 text-right tabular-nums">
                  {z.lowestResidual ? (
                    <>
                      {num(z.lowestResidual.pressure, u.pressure)}
                      <span className="block text-xs text-ink-soft">{z.lowestResidual.where}</span>
                    </>
                  ) : (
                    '—'
                  )}
                </td>
                <td className="py-1 pr-3" data-testid={`zone-static-${z.index}`}>
                  {z.highestStatic ? (
                    <>
                      <span className="tabular-nums">{num(z.highestStatic.pressure, u.pressure)}</span>{' '}
                      {z.highestStatic.pass ? (
                        `within the ${num(z.highestStatic.maximum, u.pressure)} maximum`
                      ) : (
                        <strong className="text-fault">over the {num(z.highestStatic.maximum, u.pressure)} maximum</strong>
                      )}
                      <span className="block text-xs text-ink-soft">{z.highestStatic.where}</span>
                    </>
                  ) : (
                    'no fixture served'
                  )}
                </td>
                <td className="py-1 pr-3">
                  {z.criticalFixture ? (
                    <>
                      {z.criticalFixture.label} <span className="tabular-nums">{signed(z.criticalFixture.margin, u.pressure)}</span>
                    </>
                  ) : (
                    '—'
                  )}
                </td>
                <td className="min-w-[10rem] py-1" data-testid={`zone-verdict-${z.index}`}>
                  <VerdictMark verdict={zoneVerdict(z)}>{zoneVerdictWords(z)}</VerdictMark>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
