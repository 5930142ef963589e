/**
 * The sizing's changes to a draft, as pure document edits: applying the sizes an answer chose,
 * taking them back (only where the size is still the one applied, so a later hand edit stays),
 * and the lock a designer puts on a segment's size.
 */
import type { SegmentSizing, SystemDocument } from '../../../engine';

/** The rows whose size changes. */
export const changedRows = (rows: readonly SegmentSizing[]) => rows.filter((r) => r.after !== null && r.after !== r.before);

export function applySizes(doc: SystemDocument, rows: readonly SegmentSizing[]): SystemDocument {
  const next = new Map(changedRows(rows).map((r) => [r.segmentId, r.after!]));
  return { ...doc, segments: doc.segments.map((s) => (next.has(s.id) ? { ...s, size: next.get(s.id)! } : s)) };
}

export function undoSizes(doc: SystemDocument, rows: readonly SegmentSizing[]): SystemDocument {
  const back = new Map(changedRows(rows).map((r) => [r.segmentId, r]));
  return {
    ...doc,
    segments: doc.segments.map((s) => {
      const r = back.get(s.id);
      if (!r || s.size !== r.after) return s;
      const restored = { ...s };
      if (r.before === null) delete restored.size;
      else restored.size = r.before;
      return restored;
    }),
  };
}

export function setSizeLocked(doc: SystemDocument, segmentId: string, locked: boolean): SystemDocument {
  return {
    ...doc,
    segments: doc.segments.map((s) => {
      if (s.id !== segmentId) return s;
      const next = { ...s };
      if (locked) next.sizeLocked = true;
      else delete next.sizeLocked;
      return next;
    }),
  };
}
