import { memo, useMemo } from 'react';
import { cx } from '../../../components/ui/cx';
import { num } from '../../../shared/format/quantity';
import { failingFixturesBelow, plural } from '../lib/verdict';
import { useWalk } from '../draft/walk-context';

/** What a segment's card or row is flagged with, as plain values (rows are memoised on them). */
export interface SegmentFlagValues {
  /** "10.5 ft/s over the limit of 8.0 ft/s", when the velocity is over its limit */
  fast: string | null;
  /** the names of the checked fixtures fed through this segment that fail */
  failing: string | null;
  /** what is missing on this segment or its end node (the engine's incomplete reasons) */
  missing: string | null;
}

const NONE: SegmentFlagValues = { fast: null, failing: null, missing: null };

/** The flags of every segment of the draft, from the live analysis; one map per analysis. */
export function useSegmentFlags(): (segmentId: string) => SegmentFlagValues {
  const { live, document, units } = useWalk();
  const map = useMemo(() => {
    const out = new Map<string, SegmentFlagValues>();
    if (!live.ok) return out;
    const a = live.analysis;
    const failing = failingFixturesBelow(a, document);
    const toOf = new Map(document.segments.map((s) => [s.id, s.to]));
    const missingBy = new Map<string, string[]>();
    for (const r of a.verdict.incomplete ?? []) {
      let segId: string | null = null;
      if (r.elementType === 'segment' && r.elementId) segId = r.elementId;
      else if (r.elementType === 'node' && r.elementId) segId = document.segments.find((s) => s.to === r.elementId)?.id ?? null;
      if (!segId) continue;
      missingBy.set(segId, [...(missingBy.get(segId) ?? []), r.message]);
    }
    for (const s of a.segments) {
      const fast =
        s.velocityPass === false
          ? `${num(s.velocity, units.velocity)} ${units.velocity} over the limit of ${num(s.velocityLimit, units.velocity)} ${units.velocity}`
          : null;
      const f = failing.get(s.id);
      const m = missingBy.get(s.id);
      if (fast || f || m)
        out.set(s.id, {
          fast,
          failing: f
            ? `${plural(f.length, 'fixture')} downstream ${f.length === 1 ? 'fails' : 'fail'}: ${f.slice(0, 3).join(', ')}${f.length > 3 ? ', …' : ''}`
            : null,
          missing: m ? m.join(' ') : null,
        });
    }
    // a segment the engine did not reach (e.g. before it computes) still gets its own missing marks
    for (const [segId, m] of missingBy) if (!out.has(segId) && toOf.has(segId)) out.set(segId, { fast: null, failing: null, missing: m.join(' ') });
    return out;
  }, [live, document, units]);
  return (id) => map.get(id) ?? NONE;
}

/** The marks themselves: each a shape and words, never colour alone. */
export const SegmentFlags = memo(function SegmentFlags({ fast, failing, missing, className }: SegmentFlagValues & { className?: string }) {
  if (!fast && !failing && !missing) return null;
  return (
    <span className={cx('flex flex-wrap gap-1.5 text-xs font-semibold', className)} data-testid="segment-flags">
      {fast ? (
        <span className="rounded border border-fault bg-fault-soft px-1.5 py-0.5 text-fault" data-flag="velocity">
          <span aria-hidden="true">▲ </span>Velocity {fast}
        </span>
      ) : null}
      {failing ? (
        <span className="rounded border border-fault bg-fault-soft px-1.5 py-0.5 text-fault" data-flag="failing">
          <span aria-hidden="true">▼ </span>
          {failing}
        </span>
      ) : null}
      {missing ? (
        <span className="rounded border border-caution bg-caution-soft px-1.5 py-0.5 text-caution" data-flag="incomplete">
          <span aria-hidden="true">○ </span>Incomplete: {missing}
        </span>
      ) : null}
    </span>
  );
});
