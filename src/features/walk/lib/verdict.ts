import { verdictStatus } from '../../../engine';
import type { Analysis, IncompleteReason, SystemDocument, VerdictStatus } from '../../../engine';
import type { LiveAnalysis } from '../draft/live-analysis';
import type { WalkStepId } from '../steps';

/** The live verdict of the draft: pass / fail / incomplete, or null when the engine refused the input. */
export function liveStatus(live: LiveAnalysis): VerdictStatus | null {
  return live.ok ? verdictStatus(live.analysis) : null;
}

/** "1 segment", "3 segments": the count with its noun in the right number. */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count.toLocaleString('en')} ${count === 1 ? one : many}`;
}

/**
 * The step of the walk where an incomplete item is fixed: a missing pressure at the supply, a
 * missing rise or pipe at the risers, a missing checked fixture at the remote-fixture step.
 */
export function stepOfReason(reason: Pick<IncompleteReason, 'code' | 'elementType'>): WalkStepId {
  switch (reason.code) {
    case 'no-checked-fixtures':
    case 'fixture-unreachable':
    case 'checked-fixture-unreachable':
      return 'fixtures';
    case 'source-pressure-missing':
    case 'source-basis-missing':
    case 'source-elevation-missing':
      return 'supply';
    case 'node-elevation-missing':
    case 'segment-material-missing':
    case 'segment-size-missing':
      return 'risers';
    case 'booster-shutoff-missing':
      return 'devices';
    case 'recirculation-not-computed':
      return 'result';
  }
  switch (reason.elementType) {
    case 'source':
      return 'supply';
    case 'device':
      return 'devices';
    case 'segment':
    case 'fixture-group':
      return 'risers';
    case 'fitting':
      return 'fittings';
    case 'node':
      return 'elevation';
    case 'checked-fixture':
    case 'system':
      return 'fixtures';
  }
  return 'result';
}

/**
 * The checked fixtures that fail downstream of each segment: a segment's flag says "a fixture it
 * feeds fails", so the designer sees where on the tree the margin is lost.
 */
export function failingFixturesBelow(analysis: Analysis | null, doc: SystemDocument): Map<string, string[]> {
  const out = new Map<string, string[]>();
  if (!analysis) return out;
  const feed = new Map(doc.segments.map((s) => [s.to, s]));
  for (const f of analysis.fixtures) {
    if (f.pass) continue;
    let seg = feed.get(f.nodeId);
    const seen = new Set<string>();
    while (seg && !seen.has(seg.id)) {
      seen.add(seg.id);
      const list = out.get(seg.id) ?? [];
      list.push(f.label);
      out.set(seg.id, list);
      seg = feed.get(seg.from);
    }
  }
  return out;
}
