/**
 * Plain names for messages: the name the user typed, else a description of the element in words,
 * and pressures in the document's units. Warnings and incomplete reasons use these, never a bare
 * internal id where a name exists.
 */
import { fromSI, UNIT_LABELS, type UnitSystem } from '../units';
import type { SiModel } from './input';

/** "81.50 psi" / "562.0 kPa": psi to 2 decimals, kPa to 1 (about the same resolution). */
export function formatPressure(pa: number, sys: UnitSystem): string {
  const v = fromSI('pressure', pa, sys);
  return `${v.toFixed(sys === 'US' ? 2 : 1)} ${UNIT_LABELS[sys].pressure}`;
}

/** "12.5 ft" / "3.81 m". */
export function formatLength(m: number, sys: UnitSystem): string {
  const v = fromSI('length', m, sys);
  return `${v.toFixed(sys === 'US' ? 1 : 2)} ${UNIT_LABELS[sys].length}`;
}

/** A node's typed label; else the source, or the fixture checked there; else its id in quotes. */
export function nodeName(model: SiModel, nodeIdx: number): string {
  const label = model.nodeLabels[nodeIdx];
  if (label) return `"${label}"`;
  if (nodeIdx === model.source.nodeIdx) return 'the source connection';
  const fixture = model.fixtures.find((f) => f.nodeIdx === nodeIdx);
  if (fixture) return `the node of "${fixture.label}"`;
  return `node "${model.nodeIds[nodeIdx]}"`;
}

/** A segment's typed label; else "the pipe from <node> to <node>". */
export function segmentName(model: SiModel, segIdx: number): string {
  const seg = model.segments[segIdx];
  if (seg.label) return `"${seg.label}"`;
  return `the pipe from ${nodeName(model, seg.from)} to ${nodeName(model, seg.to)}`;
}

/** "1 node", "3 nodes": proper plurals. */
export function plural(n: number, one: string, many: string = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
