/**
 * The sizing's changes to a draft, as pure document edits: applying the sizes an answer chose,
 * taking them back (only where the size is still the one applied, so a later hand edit stays),
 * and the lock a designer puts on a segment's size (a main segment's, or a unit type segment's).
 */
import { sizingBasisOf } from '../../../engine';
import type { SegmentSizing, SizingBasis, SizingResult, SystemDocument } from '../../../engine';
import { documentSizeLocks } from '../../../engine/sizing/sizeSystem';

/** The rows whose size changes. */
export const changedRows = (rows: readonly SegmentSizing[]) => rows.filter((r) => r.after !== null && r.after !== r.before);

/** The changed rows of a unit type's segments, by unit type id and the segment's local id. */
function unitRowsOf(rows: readonly SegmentSizing[]): Map<string, Map<string, SegmentSizing>> {
  const out = new Map<string, Map<string, SegmentSizing>>();
  for (const r of changedRows(rows)) {
    if (!r.unitType) continue;
    let bySegment = out.get(r.unitType.id);
    if (!bySegment) out.set(r.unitType.id, (bySegment = new Map()));
    bySegment.set(r.unitType.segmentId, r);
  }
  return out;
}

/** A unit type's segments changed one by one (the document is returned as it is when none is). */
function withUnitSegments(
  doc: SystemDocument,
  rows: readonly SegmentSizing[],
  change: (s: NonNullable<SystemDocument['unitTypes']>[number]['segments'][number], r: SegmentSizing) => typeof s,
): SystemDocument {
  const byType = unitRowsOf(rows);
  if (byType.size === 0 || !doc.unitTypes) return doc;
  return {
    ...doc,
    unitTypes: doc.unitTypes.map((t) => {
      const bySegment = byType.get(t.id);
      return bySegment ? { ...t, segments: t.segments.map((s) => (bySegment.has(s.id) ? change(s, bySegment.get(s.id)!) : s)) } : t;
    }),
  };
}

/** The sizes an answer chose: the main tree's segments, and each unit type's segments (one size for all its placements). */
export function applySizes(doc: SystemDocument, rows: readonly SegmentSizing[]): SystemDocument {
  const next = new Map(
    changedRows(rows)
      .filter((r) => !r.unitType)
      .map((r) => [r.segmentId, r.after!]),
  );
  const sized = { ...doc, segments: doc.segments.map((s) => (next.has(s.id) ? { ...s, size: next.get(s.id)! } : s)) };
  return withUnitSegments(sized, rows, (s, r) => ({ ...s, size: r.after! }));
}

/**
 * Applies a sizing answer and records its basis in the document (what it was asked to meet, when,
 * and a fingerprint of the sizes it left), so the summary can state how the sizes were chosen.
 */
export function applySizing(doc: SystemDocument, result: SizingResult, marginPa: number, at: Date): SystemDocument {
  const sized = applySizes(doc, result.segments);
  return { ...sized, sizingBasis: sizingBasisOf({ sized, result, marginPa, scope: 'system', at }) };
}

/** Takes an applied sizing back: the sizes still as applied, and the basis recorded before it. */
export function undoSizing(doc: SystemDocument, rows: readonly SegmentSizing[], previousBasis: SizingBasis | undefined): SystemDocument {
  const back = undoSizes(doc, rows);
  if (previousBasis) return { ...back, sizingBasis: previousBasis };
  const { sizingBasis: _dropped, ...rest } = back;
  return rest;
}

export function undoSizes(doc: SystemDocument, rows: readonly SegmentSizing[]): SystemDocument {
  const back = new Map(
    changedRows(rows)
      .filter((r) => !r.unitType)
      .map((r) => [r.segmentId, r]),
  );
  const unitsBack = withUnitSegments(doc, rows, (s, r) => {
    if (s.size !== r.after) return s;
    const restored = { ...s };
    if (r.before === null) delete restored.size;
    else restored.size = r.before;
    return restored;
  });
  return {
    ...unitsBack,
    segments: unitsBack.segments.map((s) => {
      const r = back.get(s.id);
      if (!r || s.size !== r.after) return s;
      const restored = { ...s };
      if (r.before === null) delete restored.size;
      else restored.size = r.before;
      return restored;
    }),
  };
}

/** The draft's size locks keyed like the answer's rows (the engine's reading of `sizeLocked`). */
export const lockedSegmentKeys = documentSizeLocks;

/** A segment with its size locked, or with the key removed (so locking then unlocking gives the segment back as it was). */
function withSizeLocked<S extends { sizeLocked?: boolean }>(segment: S, locked: boolean): S {
  const { sizeLocked: _was, ...rest } = segment;
  return (locked ? { ...rest, sizeLocked: true } : rest) as S;
}

/** The lock on a main segment's size (its `sizeLocked`; clearing removes the key). */
export function setSizeLocked(doc: SystemDocument, segmentId: string, locked: boolean): SystemDocument {
  return {
    ...doc,
    segments: doc.segments.map((s) => (s.id === segmentId ? withSizeLocked(s, locked) : s)),
  };
}

/**
 * The lock on a unit type segment's size: the unit type's `sizeLocked`, one lock for every
 * placement (clearing removes the key, so set and cleared gives the document back as it was).
 */
export function setUnitSegmentSizeLocked(doc: SystemDocument, unitTypeId: string, segmentId: string, locked: boolean): SystemDocument {
  if (!doc.unitTypes) return doc;
  return {
    ...doc,
    unitTypes: doc.unitTypes.map((t) =>
      t.id !== unitTypeId
        ? t
        : {
            ...t,
            segments: t.segments.map((s) => (s.id === segmentId ? withSizeLocked(s, locked) : s)),
          },
    ),
  };
}

/** A segment's pipe as it was before a substitution was applied. */
export type PipeBefore = { segmentId: string; material: string | undefined; size: string | undefined };

/** Applies a contractor's substitution: each substituted segment takes the answer's material and size. */
export function applySubstitution(
  doc: SystemDocument,
  material: string,
  rows: readonly SegmentSizing[],
  substituted: readonly string[],
): { document: SystemDocument; before: PipeBefore[] } {
  const chosen = new Map(rows.filter((r) => substituted.includes(r.segmentId) && r.after !== null).map((r) => [r.segmentId, r.after!]));
  const before: PipeBefore[] = [];
  const segments = doc.segments.map((s) => {
    const size = chosen.get(s.id);
    if (size === undefined) return s;
    before.push({ segmentId: s.id, material: s.material, size: s.size });
    const next = { ...s, material, size };
    delete next.custom;
    return next;
  });
  return { document: { ...doc, segments }, before };
}

/** Takes a substitution back: each segment's material and size as they were. */
export function undoSubstitution(doc: SystemDocument, before: readonly PipeBefore[]): SystemDocument {
  const back = new Map(before.map((b) => [b.segmentId, b]));
  return {
    ...doc,
    segments: doc.segments.map((s) => {
      const b = back.get(s.id);
      if (!b) return s;
      const next = { ...s };
      if (b.material === undefined) delete next.material;
      else next.material = b.material;
      if (b.size === undefined) delete next.size;
      else next.size = b.size;
      return next;
    }),
  };
}
