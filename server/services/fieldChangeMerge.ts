/**
 * Accepting a field change while the system already has a draft: the contractor's changes (what
 * differs between the issued document and the field change) are carried onto the designer's draft,
 * field by field. A field the designer has changed too, differently, is a conflict: nothing is
 * merged and the designer is told which fields collide, so neither person's work is lost silently.
 *
 * Only what a field change may change is looked at (fieldChangeRules.ts): per segment its material,
 * size, custom pipe, length and fittings; the devices, by id.
 */
import type { Device, Segment, SystemDocument } from '../../src/engine';
import { canonicalJson } from './canonicalJson';
import { SEGMENT_KEYS_ALLOWED } from './fieldChangeRules';

const same = (a: unknown, b: unknown) => canonicalJson(a) === canonicalJson(b);

export interface MergeResult {
  document: SystemDocument;
  /** field path → why it cannot be merged; empty when the merge is clean */
  conflicts: Record<string, string>;
}

type SegmentKey = (typeof SEGMENT_KEYS_ALLOWED)[number];

function setKey(segment: Segment, key: SegmentKey, value: unknown) {
  const target = segment as Record<string, unknown>;
  if (value === undefined) delete target[key];
  else target[key] = structuredClone(value);
}

export function mergeFieldChange(issued: SystemDocument, proposed: SystemDocument, draft: SystemDocument): MergeResult {
  const conflicts: Record<string, string> = {};
  const document: SystemDocument = structuredClone(draft);
  const draftSegments = new Map(document.segments.map((s) => [s.id, s]));
  const proposedSegments = new Map(proposed.segments.map((s) => [s.id, s]));

  for (const base of issued.segments) {
    const next = proposedSegments.get(base.id);
    if (!next) continue; // a field change keeps every segment (refused earlier)
    for (const key of SEGMENT_KEYS_ALLOWED) {
      if (same(base[key], next[key])) continue;
      const target = draftSegments.get(base.id);
      const path = `document.segments.${base.id}.${key}`;
      if (!target) {
        conflicts[`document.segments.${base.id}`] = 'The draft no longer has this segment, which the field change changes';
        break;
      }
      if (same(target[key], base[key])) setKey(target, key, next[key]);
      else if (!same(target[key], next[key])) conflicts[path] = 'Changed in the draft too, differently from the field change';
    }
    // a catalog pipe and a custom pipe exclude each other: the field change's choice wins where it was merged
    const target = draftSegments.get(base.id);
    if (target && next.material && !same(base.material, next.material)) delete target.custom;
  }

  const draftDevices = new Map(document.devices.map((d) => [d.id, d]));
  const issuedDevices = new Map(issued.devices.map((d) => [d.id, d]));
  const proposedDevices = new Map(proposed.devices.map((d) => [d.id, d]));
  const replace = (id: string, device: Device | undefined) => {
    const i = document.devices.findIndex((d) => d.id === id);
    if (device === undefined) {
      if (i >= 0) document.devices.splice(i, 1);
    } else if (i >= 0) document.devices[i] = structuredClone(device);
    else document.devices.push(structuredClone(device));
  };
  for (const id of new Set([...issuedDevices.keys(), ...proposedDevices.keys()])) {
    const base = issuedDevices.get(id);
    const next = proposedDevices.get(id);
    if (same(base, next)) continue;
    const inDraft = draftDevices.get(id);
    if (same(inDraft, base)) replace(id, next);
    else if (!same(inDraft, next)) conflicts[`document.devices.${id}`] = 'Changed in the draft too, differently from the field change';
  }
  // a device carried over must sit on a segment the draft has
  const segmentIds = new Set(document.segments.map((s) => s.id));
  for (const d of document.devices) {
    if (!segmentIds.has(d.segmentId) && proposedDevices.has(d.id))
      conflicts[`document.devices.${d.id}.segmentId`] = 'The draft no longer has the segment this device sits on';
  }
  return { document, conflicts };
}
