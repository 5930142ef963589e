/**
 * Zones in words, the same on the screen and in the issued summary: the verdict of a zone, the
 * floors it spans and what feeds it. Display only (the numbers come from the engine's
 * analysis/zones.ts), so it lives beside the one number format (quantity.ts) both print with.
 */
import type { ZoneResult } from '../../engine';
import { num } from './quantity';

const count = (n: number, one: string, many: string = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** "Passes: 8 fixtures checked", "Fails: 1 fixture below its minimum; static over the maximum", "Incomplete: …". */
export function zoneVerdictWords(z: ZoneResult): string {
  if (z.status === 'incomplete') return `Incomplete: ${z.incomplete.join(' ')}`;
  if (z.status === 'fail') {
    const parts: string[] = [];
    if (z.failingFixtures > 0) parts.push(`${count(z.failingFixtures, 'fixture')} below ${z.failingFixtures === 1 ? 'its' : 'their'} minimum`);
    if (z.staticFailures > 0) parts.push(`static over the maximum at ${count(z.staticFailures, 'node')}`);
    if (z.velocityFailures > 0) parts.push(`${count(z.velocityFailures, 'segment')} over the velocity limit`);
    return `Fails: ${parts.join('; ')}`;
  }
  if (z.status === 'not-checked') return 'Not checked: no checked fixture in this zone';
  return `Passes: ${count(z.checkedFixtures, 'fixture')} checked`;
}

/**
 * "Level 1 – Level 12 (12 floors)", "Level 1, Level 5 – Level 7 (4 floors)" where the floors are not
 * adjacent, or the elevation range where no node sits on a floor.
 */
export function zoneFloorsWords(z: ZoneResult, elevationUnit: string): string {
  if (z.floors.length === 1) return z.floors[0];
  if (z.floors.length > 1) {
    // an analysis stored before runs were recorded: its first and last floor, as it was issued
    const runs = z.floorRuns ?? [{ from: z.floors[0], to: z.floors[z.floors.length - 1], count: z.floors.length }];
    return `${runs.map((r) => (r.count === 1 ? r.from : `${r.from} – ${r.to}`)).join(', ')} (${z.floors.length} floors)`;
  }
  if (z.lowestElevation === null || z.highestElevation === null) return '—';
  return `el. ${num(z.lowestElevation, elevationUnit)} – ${num(z.highestElevation, elevationUnit)} ${elevationUnit}`;
}

/** "PRV-2, set 65 psi" / "BP-1, gain 40 psi" / "the supply". */
export function zoneFeedWords(z: ZoneResult, pressureUnit: string): string {
  if (z.feed.kind === 'supply' || z.feed.pressure === null) return 'the supply';
  return `${z.feed.deviceLabel}, ${z.feed.setting === 'gain' ? 'gain' : 'set'} ${num(z.feed.pressure, pressureUnit)} ${pressureUnit}`;
}
