/**
 * Plain names for messages: the name the user typed, else a description of the element in words,
 * and pressures in the document's units. Warnings and incomplete reasons use these, never a bare
 * internal id where a name exists.
 */
import { fromSI, UNIT_LABELS, type UnitSystem } from '../units';
import type { SiModel } from './input';
import type { EngineWarning } from '../warnings';

/** "81.50 psi" / "562.0 kPa": psi to 2 decimals, kPa to 1 (about the same resolution). */
export function formatPressure(pa: number, sys: UnitSystem): string {
  const v = fromSI('pressure', pa, sys);
  return `${v.toFixed(sys === 'US' ? 2 : 1)} ${UNIT_LABELS[sys].pressure}`;
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
  const label = model.seg.label[segIdx];
  if (label) return `"${label}"`;
  return `the pipe from ${nodeName(model, model.seg.from[segIdx])} to ${nodeName(model, model.seg.to[segIdx])}`;
}

/** "1 node", "3 nodes": proper plurals. */
export function plural(n: number, one: string, many: string = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * Gives every warning without one an `elementLabel`: the name the user typed for its element, or a
 * plain description (nodeName, segmentName), so a screen or the PDF never has to show an id.
 */
export function labelWarnings(model: SiModel, warnings: EngineWarning[]): void {
  let devices: Map<string, string> | null = null;
  let fixtures: Map<string, string> | null = null;
  for (const w of warnings) {
    if (w.elementLabel !== undefined || w.elementId === null) continue;
    const id = w.elementId;
    let label: string | undefined;
    switch (w.elementType) {
      case 'system':
        label = model.doc.name;
        break;
      case 'source':
        label = 'the source';
        break;
      case 'node': {
        const i = model.nodeIndex.get(id);
        if (i !== undefined) label = unquote(nodeName(model, i));
        break;
      }
      case 'segment':
      case 'fitting': {
        const s = model.segIndex.get(id);
        if (s !== undefined) label = unquote(segmentName(model, s));
        break;
      }
      case 'device': {
        devices ??= new Map(model.doc.devices.map((d) => [d.id, d.label]));
        label = devices.get(id);
        break;
      }
      case 'checked-fixture': {
        fixtures ??= new Map(model.fixtures.map((f) => [f.id, f.label]));
        label = fixtures.get(id);
        break;
      }
    }
    if (label !== undefined) w.elementLabel = label;
  }
}

/** A segment's name for a label field: the typed name without quotes, or the description. */
export function segmentLabel(model: SiModel, segIdx: number): string {
  return unquote(segmentName(model, segIdx));
}

/** '"Riser 3"' → 'Riser 3' (a typed name shown as a label needs no quotes); descriptions unchanged. */
function unquote(name: string): string {
  return name.startsWith('"') && name.endsWith('"') ? name.slice(1, -1) : name;
}
