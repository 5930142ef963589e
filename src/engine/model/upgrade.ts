/**
 * Version 1 → version 2 of the system document.
 *
 * In version 1 every node had an absolute elevation, and a segment's optional `rise` was only
 * checked against its two node elevations (a mismatch was a caution, the elevations were used).
 * Version 2 allows one truth: a node placed by its elevation (or floor) has no rise on its feed
 * segment, and a node without a position is placed by its feed segment's rise.
 *
 * The upgrade, per segment with a rise:
 *   - consistent (|rise − (z_to − z_from)| within the document's v1 `riseTolerance`, default
 *     0.1 ft ≈ 0.03 m, common practice for floor-to-floor dimensions): the rise is dropped, the
 *     elevations kept. The analysis is then bit-identical to version 1's (same elevations).
 *   - conflicting, with `riseConflict`:
 *       'keep-elevations' (issued revisions: reproduce what was analysed, because version 1
 *         analysed with the elevations): the rise is dropped;
 *       'follow-rises' (drafts: the rise the user typed was the intent, the elevations were left
 *         over, e.g. all at the source's elevation): the to-node loses its elevation and is placed
 *         by the rise, and each node below it becomes relative too, its feed segment's rise being
 *         its version 1 elevation difference, so the subtree moves with the typed rise.
 * `criteria.riseTolerance` is dropped (version 2 has nothing to compare); a booster's `{ gain }` is
 * kept as it is (version 2 reads it as constant speed with an assumed shutoff, see schema.ts).
 *
 * Pure: returns a new document, the input is not changed. The input must have passed the
 * version 1 schema (SystemDocumentSchemaV1).
 */
import type { SystemDocument } from './schema';
import type { SystemDocumentV1 } from './schemaV1';
import { keyOrder } from './describe';
import { SEGMENT } from './elements';

const SEGMENT_ORDER = keyOrder(SEGMENT);

export type RiseConflictRule = 'keep-elevations' | 'follow-rises';

export interface UpgradeOptions {
  riseConflict: RiseConflictRule;
}

/** A rise that disagreed with its node elevations in the version 1 document. */
export interface RiseConflict {
  segmentId: string;
  toNodeId: string;
  rise: number;
  elevationDifference: number;
}

export interface UpgradeResult {
  document: SystemDocument;
  conflicts: RiseConflict[];
}

/** 0.1 ft, version 1's default rise tolerance, in the document's length unit. */
const DEFAULT_TOLERANCE = { US: 0.1, SI: 0.1 * 0.3048 } as const;

export function upgradeDocument(doc: SystemDocumentV1, options: UpgradeOptions): SystemDocument {
  return upgradeDocumentWithReport(doc, options).document;
}

/** The upgrade and the list of conflicting rises it resolved (for a message to the user). */
export function upgradeDocumentWithReport(doc: SystemDocumentV1, options: UpgradeOptions): UpgradeResult {
  const tolerance = doc.criteria?.riseTolerance ?? DEFAULT_TOLERANCE[doc.unitSystem];
  const elevationOf = new Map<string, number>();
  for (const n of doc.nodes) if (!elevationOf.has(n.id)) elevationOf.set(n.id, n.elevation);

  const conflicts: RiseConflict[] = [];
  const keepRise = new Set<string>(); // segment ids whose rise stays
  const relative = new Set<string>(); // node ids that lose their elevation
  for (const seg of doc.segments) {
    if (seg.rise === undefined) continue;
    const zFrom = elevationOf.get(seg.from);
    const zTo = elevationOf.get(seg.to);
    if (zFrom === undefined || zTo === undefined) continue; // an unknown node: the analysis reports it
    const diff = zTo - zFrom;
    if (Math.abs(seg.rise - diff) <= tolerance) continue;
    conflicts.push({ segmentId: seg.id, toNodeId: seg.to, rise: seg.rise, elevationDifference: diff });
    if (options.riseConflict === 'follow-rises') {
      keepRise.add(seg.id);
      relative.add(seg.to);
    }
  }

  // Follow the rises: every node below a relative node becomes relative, its feed segment carrying
  // its version 1 elevation difference (so the subtree keeps its shape and moves with the rise).
  const derivedRise = new Map<string, number>(); // segment id → rise written
  if (relative.size > 0) {
    const childSegs = new Map<string, typeof doc.segments>();
    for (const seg of doc.segments) {
      const list = childSegs.get(seg.from);
      if (list) list.push(seg);
      else childSegs.set(seg.from, [seg]);
    }
    const stack = [...relative];
    const visited = new Set<string>(stack);
    while (stack.length > 0) {
      const nodeId = stack.pop()!;
      for (const seg of childSegs.get(nodeId) ?? []) {
        if (keepRise.has(seg.id) || visited.has(seg.to)) continue;
        const zFrom = elevationOf.get(seg.from);
        const zTo = elevationOf.get(seg.to);
        if (zFrom === undefined || zTo === undefined) continue;
        derivedRise.set(seg.id, zTo - zFrom);
        relative.add(seg.to);
        visited.add(seg.to);
        stack.push(seg.to);
      }
    }
  }

  const nodes = doc.nodes.map((n) => {
    // Keys in the schema's order: id, label, elevation, fixtureGroups, continuousDemand, checkedFixtures.
    const out: Record<string, unknown> = { id: n.id };
    if (n.label !== undefined) out.label = n.label;
    if (!relative.has(n.id)) out.elevation = n.elevation;
    out.fixtureGroups = n.fixtureGroups;
    if (n.continuousDemand !== undefined) out.continuousDemand = n.continuousDemand;
    out.checkedFixtures = n.checkedFixtures;
    return out as SystemDocument['nodes'][number];
  });

  const segments = doc.segments.map((seg) => {
    const { rise, ...rest } = seg;
    const out = { ...rest } as SystemDocument['segments'][number];
    if (keepRise.has(seg.id) && rise !== undefined) out.rise = rise;
    else if (derivedRise.has(seg.id)) out.rise = derivedRise.get(seg.id)!;
    return reorderSegment(out);
  });

  let criteria: SystemDocument['criteria'];
  if (doc.criteria) {
    const { riseTolerance: _dropped, ...rest } = doc.criteria;
    criteria = rest;
  }

  const document: SystemDocument = {
    schemaVersion: 2,
    id: doc.id,
    name: doc.name,
    service: doc.service,
    unitSystem: doc.unitSystem,
    waterTemperature: doc.waterTemperature,
    source: doc.source,
    devices: doc.devices,
    floors: [],
    nodes,
    segments,
  };
  if (criteria !== undefined) document.criteria = criteria;
  if (doc.notes !== undefined) document.notes = doc.notes;
  return { document, conflicts };
}

/** Keys in the schema's order (a parsed version 2 document has them so). */
function reorderSegment(seg: SystemDocument['segments'][number]): SystemDocument['segments'][number] {
  const out: Record<string, unknown> = {};
  for (const k of SEGMENT_ORDER) if (k in seg) out[k] = (seg as Record<string, unknown>)[k];
  return out as SystemDocument['segments'][number];
}
