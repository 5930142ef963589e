import { useMemo, useState } from 'react';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { CellInput, CellSelect } from '../../walk/components/cells';
import type { Placement, UnitType } from '../../../engine/building/schema';
import type { Floor } from '../../../engine/building/riserBuilder';

type SegmentOverrides = NonNullable<NonNullable<Placement['overrides']>['segments']>;

function withLength(p: Placement, segmentId: string, length: number | null): Placement {
  const segments: SegmentOverrides = { ...(p.overrides?.segments ?? {}) };
  if (length === null) delete segments[segmentId];
  else segments[segmentId] = { ...segments[segmentId], length };
  const { overrides: _old, ...rest } = p;
  void _old;
  const overrides = { ...(Object.keys(segments).length > 0 ? { segments } : {}), ...(p.overrides?.nodes ? { nodes: p.overrides.nodes } : {}) };
  return Object.keys(overrides).length > 0 ? { ...rest, overrides } : rest;
}

/**
 * Placements listed at first: a generated tower has hundreds (320 on 40 floors), each row a few
 * controls; drawing them all held the verdict back by about a second after "Generate". The rest
 * come a page at a time, on request.
 */
export const PLACEMENTS_PAGE = 24;

/** One row per placement: its unit type, floor, and every field it overrides (editable, removable, marked). */
export function PlacementsList({
  placements,
  unitTypes,
  floors,
  lengthUnit,
  readOnly,
  onChange,
}: {
  placements: readonly Placement[];
  unitTypes: readonly UnitType[];
  floors: readonly Floor[];
  lengthUnit: string;
  readOnly: boolean;
  onChange: (p: Placement) => void;
}) {
  const [adding, setAdding] = useState<Record<string, string>>({});
  const [shown, setShown] = useState(PLACEMENTS_PAGE);
  const types = useMemo(() => new Map(unitTypes.map((t) => [t.id, t])), [unitTypes]);
  const floorNames = useMemo(() => new Map(floors.map((f) => [f.id, f.name])), [floors]);
  if (placements.length === 0) return null;
  const typeOf = (id: string) => types.get(id);
  const floorName = (id: string) => floorNames.get(id) ?? id;
  const rest = placements.length - shown;
  return (
    <Section title={`Placements (${placements.length})`}>
      <table className="w-full text-sm" data-testid="placements">
        <thead>
          <tr className="text-left">
            <th scope="col">Unit</th>
            <th scope="col">Type</th>
            <th scope="col">Floor</th>
            <th scope="col">Overrides of its type</th>
          </tr>
        </thead>
        <tbody>
          {placements.slice(0, shown).map((p) => {
            const type = typeOf(p.unitTypeId);
            const overrides = Object.entries(p.overrides?.segments ?? {});
            const segLabel = (id: string) => type?.segments.find((s) => s.id === id)?.label ?? id;
            const free = (type?.segments ?? []).filter((s) => !(p.overrides?.segments ?? {})[s.id]);
            return (
              <tr key={p.id} className="border-t border-rule align-top" data-testid={`placement-${p.id}`}>
                <td className="py-1 pr-2 font-semibold">{p.label}</td>
                <td className="py-1 pr-2">{type?.name ?? p.unitTypeId}</td>
                <td className="py-1 pr-2">{floorName(p.floor)}</td>
                <td className="py-1">
                  <div className="flex flex-col gap-1">
                    {overrides.length === 0 ? <span className="text-ink-muted">as its type</span> : null}
                    {overrides.map(([segId, o]) => (
                      <div key={segId} className="flex flex-wrap items-center gap-2">
                        <Badge tone="copper">override</Badge>
                        <span>
                          {segLabel(segId)} length ({lengthUnit}; type: {type?.segments.find((s) => s.id === segId)?.length ?? '—'})
                        </span>
                        {o.length !== undefined ? (
                          <CellInput
                            label={`${p.label} ${segLabel(segId)} length override`}
                            className="w-20"
                            inputMode="decimal"
                            defaultValue={o.length}
                            disabled={readOnly}
                            onBlur={(e) => {
                              const v = Number(e.target.value);
                              if (v > 0 && v !== o.length) onChange(withLength(p, segId, v));
                            }}
                          />
                        ) : null}
                        {!readOnly ? (
                          <Button variant="quiet" onClick={() => onChange(withLength(p, segId, null))}>
                            Use the type’s
                          </Button>
                        ) : null}
                      </div>
                    ))}
                    {!readOnly && free.length > 0 ? (
                      <div className="flex items-center gap-2">
                        <CellSelect
                          label={`${p.label} override a segment`}
                          className="w-44"
                          value={adding[p.id] ?? ''}
                          onChange={(e) => setAdding({ ...adding, [p.id]: e.target.value })}
                          options={[{ value: '', label: 'Override a length…' }, ...free.map((s) => ({ value: s.id, label: s.label ?? s.id }))]}
                        />
                        {adding[p.id] ? (
                          <Button
                            variant="quiet"
                            onClick={() => {
                              const s = type!.segments.find((x) => x.id === adding[p.id])!;
                              onChange(withLength(p, s.id, s.length));
                              setAdding({ ...adding, [p.id]: '' });
                            }}
                          >
                            Add
                          </Button>
                        ) : null}
                      </div>
                    ) : null}
                  </div>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {rest > 0 ? (
        <p className="mt-2 flex flex-wrap items-center gap-3 text-sm" data-testid="placements-more">
          <span>
            {shown} of {placements.length} shown.
          </span>
          <Button variant="secondary" onClick={() => setShown((n) => n + PLACEMENTS_PAGE * 4)}>
            Show {Math.min(rest, PLACEMENTS_PAGE * 4)} more
          </Button>
          <Button variant="quiet" onClick={() => setShown(placements.length)}>
            Show all {placements.length}
          </Button>
        </p>
      ) : null}
    </Section>
  );
}
