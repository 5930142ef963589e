import { useId } from 'react';
import type { Analysis, PressureLedger } from '../../../engine';
import { axisTickLabel, num } from '../../../shared/format/quantity';

export interface ProfilePoint {
  distance: number;
  pressure: number;
  label: string;
}

/**
 * Pressure against developed length from the source along the fixture's path: the start, a
 * drop at each device (at the segment's inlet), then the segment's friction, fittings and climb
 * spread over its length (the ledger gives them per segment, not point by point).
 */
export function profilePoints(analysis: Analysis, ledger: PressureLedger): ProfilePoint[] {
  const seg = new Map(analysis.segments.map((s) => [s.id, s]));
  const points: ProfilePoint[] = [];
  let pressure = ledger.lines[0]?.pressureAfter ?? 0;
  points.push({ distance: 0, pressure, label: 'Source' });
  for (const line of ledger.lines.slice(1)) {
    const s = line.segmentId ? seg.get(line.segmentId) : undefined;
    if (!s) continue;
    const start = s.developedLength - s.length;
    pressure = line.pressureAfter;
    if (line.kind === 'device') points.push({ distance: start, pressure, label: line.label });
    if (line.kind === 'rise') points.push({ distance: s.developedLength, pressure, label: s.label ?? s.id });
  }
  return points;
}

export interface ZoneCrossing {
  distance: number;
  /** "Zone 2", the zone's number (the full name is in the zones table and the chart's text). */
  short: string;
  name: string;
}

/** Where the path enters a zone: at the inlet of the segment carrying the zone's PRV or booster (analysis/zones.ts). */
export function zoneCrossings(analysis: Analysis, ledger: PressureLedger): ZoneCrossing[] {
  const zones = new Map((analysis.zones ?? []).map((z) => [z.id, z]));
  const seg = new Map(analysis.segments.map((s) => [s.id, s]));
  const out: ZoneCrossing[] = [];
  for (const line of ledger.lines) {
    if (line.kind !== 'device') continue;
    const z = zones.get(line.elementId);
    const s = line.segmentId ? seg.get(line.segmentId) : undefined;
    if (!z || !s) continue;
    out.push({ distance: s.developedLength - s.length, short: `Zone ${z.index}`, name: z.name });
  }
  return out;
}

/** A hand-drawn SVG line chart with the minimum flow pressure as a dashed line, and the same numbers as a table. */
export function PressureProfileChart({ analysis, ledger, fixtureLabel }: { analysis: Analysis; ledger: PressureLedger; fixtureLabel: string }) {
  const id = useId();
  const points = profilePoints(analysis, ledger);
  const crossings = zoneCrossings(analysis, ledger);
  const u = analysis.units;
  const W = 640;
  const H = 300;
  const pad = { l: 56, r: 16, t: 16, b: 44 };
  const maxX = Math.max(1, ...points.map((p) => p.distance));
  const values = [...points.map((p) => p.pressure), ledger.required, 0];
  const minY = Math.min(...values);
  const maxY = Math.max(...values) * 1.05 || 1;
  const x = (d: number) => pad.l + (d / maxX) * (W - pad.l - pad.r);
  const y = (p: number) => pad.t + (1 - (p - minY) / (maxY - minY || 1)) * (H - pad.t - pad.b);
  const ticks = (lo: number, hi: number, n: number) => Array.from({ length: n + 1 }, (_, i) => lo + ((hi - lo) * i) / n);
  const path = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(p.distance).toFixed(1)},${y(p.pressure).toFixed(1)}`).join(' ');
  const last = points.at(-1)!;
  return (
    <figure className="flex flex-col gap-2">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-labelledby={`${id}-t ${id}-d`}
        className="w-full max-w-3xl rounded-md border-2 border-rule bg-surface"
        data-testid="pressure-chart"
      >
        <title id={`${id}-t`}>Pressure along the path to {fixtureLabel}</title>
        <desc id={`${id}-d`}>
          Pressure falls from {num(points[0].pressure, u.pressure)} {u.pressure} at the source to {num(last.pressure, u.pressure)} {u.pressure} at{' '}
          {fixtureLabel}, {num(last.distance, u.length)} {u.length} of pipe away; the minimum flow pressure is {num(ledger.required, u.pressure)} {u.pressure}.
          {crossings.map((c) => ` The path enters ${c.name} at ${num(c.distance, u.length)} ${u.length}.`).join('')}
        </desc>
        {ticks(minY, maxY, 5).map((t) => (
          <g key={`y${t}`}>
            <line x1={pad.l} x2={W - pad.r} y1={y(t)} y2={y(t)} stroke="#c7c9c3" strokeWidth="1" />
            <text x={pad.l - 6} y={y(t) + 4} textAnchor="end" fontSize="11" fill="#3d4a53">
              {axisTickLabel(t, (maxY - minY) / 5)}
            </text>
          </g>
        ))}
        {ticks(0, maxX, 5).map((t) => (
          <text key={`x${t}`} x={x(t)} y={H - pad.b + 16} textAnchor="middle" fontSize="11" fill="#3d4a53">
            {axisTickLabel(t, maxX / 5)}
          </text>
        ))}
        <text x={(pad.l + W - pad.r) / 2} y={H - 6} textAnchor="middle" fontSize="12" fill="#17222a">
          Developed length from the source ({u.length})
        </text>
        <text x={14} y={(pad.t + H - pad.b) / 2} textAnchor="middle" fontSize="12" fill="#17222a" transform={`rotate(-90 14 ${(pad.t + H - pad.b) / 2})`}>
          Pressure ({u.pressure})
        </text>
        <line x1={pad.l} x2={W - pad.r} y1={y(ledger.required)} y2={y(ledger.required)} stroke="#9b1c1c" strokeWidth="2" strokeDasharray="8 5" />
        <text x={W - pad.r - 4} y={y(ledger.required) - 6} textAnchor="end" fontSize="11" fill="#9b1c1c">
          minimum {num(ledger.required, u.pressure)}
        </text>
        {crossings.map((c, i) => (
          <g key={`zone-${i}`} data-testid="zone-crossing">
            <line x1={x(c.distance)} x2={x(c.distance)} y1={pad.t} y2={H - pad.b} stroke="#3d4a53" strokeWidth="1.5" strokeDasharray="2 3" />
            <text x={x(c.distance) + 4} y={pad.t + 12 + (i % 2) * 13} fontSize="11" fill="#17222a">{`▸ ${c.short}`}</text>
          </g>
        ))}
        <path d={path} fill="none" stroke="#123f4a" strokeWidth="2.5" />
        {points.map((p, i) => (
          <rect key={i} x={x(p.distance) - 3} y={y(p.pressure) - 3} width="6" height="6" fill="#a4501c" />
        ))}
      </svg>
      <figcaption className="text-sm text-ink-soft">
        Solid line: pressure along the path (squares at each device and segment end). Dashed line: the minimum flow pressure.
        {crossings.length > 0 ? ` Dotted upright lines: where the path enters a zone (${crossings.map((c) => c.name).join('; ')}).` : ''}
      </figcaption>
      <details>
        <summary className="cursor-pointer text-sm font-semibold">The chart’s numbers as a table</summary>
        <table className="mt-2 text-sm" data-testid="chart-table">
          <caption className="sr-only">Pressure against developed length</caption>
          <thead>
            <tr className="text-left">
              <th scope="col" className="pr-4">
                Point
              </th>
              <th scope="col" className="pr-4 text-right">
                Distance ({u.length})
              </th>
              <th scope="col" className="text-right">
                Pressure ({u.pressure})
              </th>
            </tr>
          </thead>
          <tbody>
            {points.map((p, i) => (
              <tr key={i}>
                <th scope="row" className="pr-4 text-left font-normal">
                  {p.label}
                </th>
                <td className="pr-4 text-right tabular-nums">{num(p.distance, u.length)}</td>
                <td className="text-right tabular-nums">{num(p.pressure, u.pressure)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
