/**
 * What a field change may change, checked structurally against the issued document (the client is
 * not trusted), and the list of what it did change, in words, for the side by side, the e-mails
 * and the issued summary.
 *
 * A contractor may change, per existing segment, the keys its description marks `changedBy:
 * 'field-change'` (src/engine/model/elements.ts: material, size, custom pipe data, length — an extra
 * offset adds pipe — and fittings); and the devices (change, add, remove). Everything else is the
 * designer's and stays as issued: source, criteria, nodes (elevations, fixture groups, checked
 * fixtures), the segment's other keys (topology, rise, label, design-flow override, size-change
 * setting, any key added later unless its description says otherwise), water temperature, name,
 * notes; no segment is added or removed.
 */
import { UNIT_LABELS, type Device, type Segment, type SystemDocument } from '../../src/engine';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { fieldChangeKeys } from '../../src/engine/model/describe';
import { SEGMENT } from '../../src/engine/model/elements';
import { boosterText, fittingLabel } from '../../src/engine/model/labels';
import { canonicalJson } from './canonicalJson';
import { num } from '../../src/shared/format/quantity';
import type { ChangeField, ChangeItem } from '../../src/shared/api/fieldChanges';

/** The keys of a segment a contractor may change: from the segment's description. */
export const SEGMENT_KEYS_ALLOWED: readonly (keyof Segment)[] = fieldChangeKeys(SEGMENT);
const ALLOWED = new Set<string>(SEGMENT_KEYS_ALLOWED);

const same = (a: unknown, b: unknown) => canonicalJson(a) === canonicalJson(b);
const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);
const keyedById = (v: unknown): v is { id: string }[] =>
  Array.isArray(v) && v.every((x) => isObject(x) && typeof x.id === 'string') && new Set(v.map((x) => (x as { id: string }).id)).size === v.length;

/**
 * The paths where `b` differs from `a`: objects by key, arrays of elements with ids by id
 * (`nodes.l2.checkedFixtures.lav-2.minFlowPressure`), anything else as a whole.
 */
export function differingPaths(a: unknown, b: unknown, path: string): string[] {
  if (same(a, b)) return [];
  if (isObject(a) && isObject(b)) {
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
    return keys.flatMap((k) => differingPaths(a[k], b[k], `${path}.${k}`));
  }
  if (keyedById(a) && keyedById(b)) {
    const ia = new Map(a.map((x) => [x.id, x]));
    const ib = new Map(b.map((x) => [x.id, x]));
    const out: string[] = [];
    for (const [id, x] of ia) out.push(...(ib.has(id) ? differingPaths(x, ib.get(id), `${path}.${id}`) : [`${path}.${id}`]));
    for (const id of ib.keys()) if (!ia.has(id)) out.push(`${path}.${id}`);
    // the same elements in another order
    if (!out.length) out.push(path);
    return out;
  }
  return [path];
}

/**
 * Every difference a contractor may not make, as field path → message; empty when the proposed
 * document changes only what a field change may change. Both documents are parsed (defaults applied).
 */
export function forbiddenDifferences(issued: SystemDocument, proposed: SystemDocument): Record<string, string> {
  const fields: Record<string, string> = {};
  const keep = 'Stays as issued: the designer changes this, not a field change';
  const top = [...new Set([...Object.keys(issued), ...Object.keys(proposed)])].filter((k) => k !== 'segments' && k !== 'devices');
  for (const k of top)
    for (const p of differingPaths(issued[k as keyof SystemDocument], proposed[k as keyof SystemDocument], `document.${k}`)) fields[p] = keep;

  const before = new Map(issued.segments.map((s) => [s.id, s]));
  const after = new Map(proposed.segments.map((s) => [s.id, s]));
  for (const [id, s] of before) {
    const t = after.get(id);
    if (!t) {
      fields[`document.segments.${id}`] = 'Removed: a field change keeps every issued segment';
      continue;
    }
    const keys = [...new Set([...Object.keys(s), ...Object.keys(t)])].filter((k) => !ALLOWED.has(k));
    for (const k of keys) for (const p of differingPaths(s[k as keyof Segment], t[k as keyof Segment], `document.segments.${id}.${k}`)) fields[p] = keep;
  }
  for (const id of after.keys()) if (!before.has(id)) fields[`document.segments.${id}`] = 'Added: a field change keeps the issued segments (no new pipe runs)';
  return fields;
}

// ---- the changes in words

const materialLabel = (id: string | undefined) => (id ? (MATERIALS[id as keyof typeof MATERIALS]?.label ?? id) : null);
/** A custom fitting (project data) prints its own label and value (src/engine/model/labels.ts). */
const fittingsText = (f: Segment['fittings']) =>
  f.length ? f.map((x) => `${x.count}× ${x.custom ? fittingLabel(x) : (FITTING_TYPES[x.typeId]?.label ?? x.typeId)}`).join('; ') : 'none';

function deviceLossText(d: Device, pressure: string, flow: string): string {
  if (d.loss.kind === 'fixed') return `fixed loss ${num(d.loss.loss, pressure)} ${pressure}`;
  return `loss curve ${d.loss.points.map((p) => `${num(p.loss, pressure)} ${pressure} at ${num(p.flow, flow)} ${flow}`).join(', ')}`;
}

function segmentFields(s: Segment, t: Segment, length: string, diameter: string): ChangeField[] {
  const out: ChangeField[] = [];
  if (s.material !== t.material) out.push({ field: 'material', before: materialLabel(s.material), after: materialLabel(t.material) });
  if (s.size !== t.size) out.push({ field: 'size', before: s.size ?? null, after: t.size ?? null });
  if (!same(s.custom, t.custom)) {
    const c = (x: Segment['custom']) =>
      x ? `custom pipe, inside diameter ${num(x.innerDiameter, diameter)} ${diameter}, roughness ${x.roughness} ${diameter}, C ${x.hazenWilliamsC}` : null;
    out.push({ field: 'custom', before: c(s.custom), after: c(t.custom) });
  }
  if (s.length !== t.length) out.push({ field: 'length', before: `${num(s.length, length)} ${length}`, after: `${num(t.length, length)} ${length}` });
  if (!same(s.fittings, t.fittings)) out.push({ field: 'fittings', before: fittingsText(s.fittings), after: fittingsText(t.fittings) });
  return out;
}

function deviceFields(d: Device, e: Device, pressure: string, flow: string): ChangeField[] {
  const out: ChangeField[] = [];
  if (d.kind !== e.kind) out.push({ field: 'kind', before: d.kind, after: e.kind });
  if (d.label !== e.label) out.push({ field: 'label', before: d.label, after: e.label });
  if (d.segmentId !== e.segmentId) out.push({ field: 'segmentId', before: d.segmentId, after: e.segmentId });
  if (!same(d.loss, e.loss)) out.push({ field: 'loss', before: deviceLossText(d, pressure, flow), after: deviceLossText(e, pressure, flow) });
  if (!same(d.prv, e.prv))
    out.push({
      field: 'prv',
      before: d.prv ? `set ${num(d.prv.setPressure, pressure)} ${pressure}` : null,
      after: e.prv ? `set ${num(e.prv.setPressure, pressure)} ${pressure}` : null,
    });
  if (!same(d.boost, e.boost))
    out.push({ field: 'boost', before: d.boost ? boosterText(d.boost, pressure) : null, after: e.boost ? boosterText(e.boost, pressure) : null });
  return out;
}

const sentence = (kind: string, label: string, change: ChangeItem['change'], fields: ChangeField[]) =>
  change === 'changed'
    ? `${kind} ${label}: ${fields.map((f) => `${f.field} ${f.before ?? 'none'} → ${f.after ?? 'none'}`).join('; ')}`
    : `${kind} ${label} ${change}`;

/** What the field change changed (segments in issued order, then devices), in words and the document's units. */
export function describeChanges(issued: SystemDocument, proposed: SystemDocument): ChangeItem[] {
  const u = UNIT_LABELS[proposed.unitSystem];
  const items: ChangeItem[] = [];
  const after = new Map(proposed.segments.map((s) => [s.id, s]));
  for (const s of issued.segments) {
    const t = after.get(s.id);
    if (!t) continue; // refused by forbiddenDifferences
    const fields = segmentFields(s, t, u.length, u.diameter);
    const label = s.label ?? s.id;
    if (fields.length)
      items.push({ elementType: 'segment', elementId: s.id, label, change: 'changed', fields, text: sentence('Segment', label, 'changed', fields) });
  }
  const devicesAfter = new Map(proposed.devices.map((d) => [d.id, d]));
  const devicesBefore = new Map(issued.devices.map((d) => [d.id, d]));
  for (const d of issued.devices) {
    const e = devicesAfter.get(d.id);
    if (!e) {
      items.push({ elementType: 'device', elementId: d.id, label: d.label, change: 'removed', fields: [], text: sentence('Device', d.label, 'removed', []) });
      continue;
    }
    const fields = deviceFields(d, e, u.pressure, u.flow);
    if (fields.length)
      items.push({ elementType: 'device', elementId: d.id, label: e.label, change: 'changed', fields, text: sentence('Device', e.label, 'changed', fields) });
  }
  for (const e of proposed.devices) {
    if (devicesBefore.has(e.id)) continue;
    const fields: ChangeField[] = [{ field: 'loss', before: null, after: deviceLossText(e, u.pressure, u.flow) }];
    items.push({
      elementType: 'device',
      elementId: e.id,
      label: e.label,
      change: 'added',
      fields,
      text: `Device ${e.label} added on segment ${e.segmentId} (${fields[0].after})`,
    });
  }
  return items;
}
