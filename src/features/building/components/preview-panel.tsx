import { num } from '../../../shared/format/quantity';
import type { BuildingCounts } from '../lib/build';

/** What "Generate" would write, counted before anything is written. */
export function PreviewPanel({ counts, problem }: { counts: BuildingCounts | null; problem: string | null }) {
  if (!counts) {
    return (
      <p className="text-sm text-ink-soft" data-testid="building-preview-problem">
        {problem ?? 'Complete the floors, a unit type and the riser builder to see what will be generated.'}
      </p>
    );
  }
  const items: [string, string, string][] = [
    ['segments', 'Segments', String(counts.segments)],
    ['nodes', 'Nodes', String(counts.nodes)],
    ['placements', 'Units placed', String(counts.placements)],
    ...(counts.devices > 0 ? ([['devices', 'Zone PRVs and boosters', String(counts.devices)]] as [string, string, string][]) : []),
    ['fixture-units', 'Fixture units (WSFU)', num(counts.fixtureUnits, 'WSFU')],
    ['checked', 'Checked fixtures', String(counts.checkedFixtures)],
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-5" data-testid="building-preview">
      {items.map(([key, label, value]) => (
        <div key={key} className="rounded-md border-2 border-rule bg-paper p-2">
          <dt className="text-xs font-semibold uppercase tracking-wide text-ink-muted">{label}</dt>
          <dd className="text-2xl tabular-nums" data-testid={`preview-${key}`}>
            {value}
          </dd>
        </div>
      ))}
    </dl>
  );
}
