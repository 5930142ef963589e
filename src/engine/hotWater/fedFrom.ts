/**
 * A hot-water system fed from a cold-water system: its supply is the cold system's pressure at the
 * node that feeds the water heater, read from the cold system's current analysis, never typed.
 *
 *   pressure at the hot source at design flow = residual pressure at that cold node at the cold
 *   system's design flow (the cold system's demand includes the heater's feed);
 *   high static pressure at the hot source = the cold node's high static pressure.
 *
 * The water heater's own loss is not taken here: the water-heater device on the hot system's first
 * segment deducts it, as any in-line device does (counting it here too would count it twice). The
 * hot source node sits where the heater is fed: its elevation should be the cold node's (the
 * designer places it; the climb from there on is the hot system's own).
 *
 * One function for the server (at save, issue and read, and when the cold system changes) and for
 * the walk (from the cold system's current analysis fetched by the client). It writes the source's
 * static pressures and basis and the `resolution`; when the cold system or node is missing, it
 * writes an unresolved resolution and leaves the typed pressures alone — the analysis then reports
 * the reason as Incomplete (report.ts), so the verdict is never green on them. Nothing else changes.
 */
import type { Analysis } from '../analysis/types';
import { FED_FROM_CLOSING_MAX, type FedFrom, type SystemDocument } from '../model/schema';
import { fromSI } from '../units';

/** What the resolver needs of the cold system: its name and service, and its current revision's analysis. */
export interface ColdSupplyView {
  systemId: string;
  name: string;
  service: 'cold' | 'hot';
  /** The revision read: the cold system's draft, or else its current issued revision; null when it has none. */
  revision: {
    number: number;
    status: 'draft' | 'issued';
    /** The stored analysis: the engine's result, or its error. */
    analysis: { ok: true; analysis: Analysis } | { ok: false; error?: { message?: string } };
    /** The revision's document, where the reader has it: its check-valve fittings upstream of the node close the hot system too. */
    document?: unknown;
  } | null;
}

/** A device or check valve of the cold system between its source and the heater feed (closes the hot system to thermal expansion). */
export type ClosingElementView = NonNullable<Extract<Resolution, { status: 'resolved' }>['closedBy']>[number];

const CLOSING_DEVICES = new Set(['backflow-preventer', 'prv']);
const CHECK_VALVES = new Set(['valve-check-swing', 'valve-check-lift']);

/**
 * The cold system's backflow preventers and PRVs (from its analysis) and check valves (from its
 * document, when given) on the path from its source to `nodeId`, source first. A device sits at its
 * segment's inlet, so every device of a segment on the path is upstream of the node.
 */
export function closingElementsUpstream(a: Analysis, nodeId: string, document?: unknown): ClosingElementView[] {
  const segs = a.segments;
  const byId = new Map(segs.map((s) => [s.id, s]));
  const path: typeof segs = [];
  let seg = segs.find((s) => s.to === nodeId);
  while (seg && path.length <= segs.length) {
    path.push(seg);
    seg = seg.parentSegmentId === null ? undefined : byId.get(seg.parentSegmentId);
  }
  path.reverse();
  const docSegments = new Map<string, { label?: string; fittings?: { typeId: string }[] }>();
  const raw = (document as { segments?: unknown } | null | undefined)?.segments;
  if (Array.isArray(raw)) for (const s of raw as { id?: unknown }[]) if (s && typeof s.id === 'string') docSegments.set(s.id, s as never);
  const out: ClosingElementView[] = [];
  for (const s of path) {
    for (const d of s.devices) {
      if (CLOSING_DEVICES.has(d.kind))
        out.push({ kind: d.kind as 'backflow-preventer' | 'prv', elementId: d.deviceId, label: (d.label || d.deviceId).slice(0, 200) });
    }
    const fittings = docSegments.get(s.id)?.fittings;
    if (Array.isArray(fittings) && fittings.some((f) => f && CHECK_VALVES.has(f.typeId))) {
      out.push({ kind: 'check-valve', elementId: s.id, label: `check valve on ${s.label || `segment ${s.id}`}`.slice(0, 200) });
    }
  }
  return out.slice(0, FED_FROM_CLOSING_MAX);
}

type Resolution = NonNullable<FedFrom['resolution']>;
type Unresolved = Extract<Resolution, { status: 'unresolved' }>;

function unresolved(code: Unresolved['code'], message: string): Unresolved {
  return { status: 'unresolved', code, message };
}

/** The resolution of `fedFrom` against the cold system (null: the cold system is not in the project). */
export function resolveFedFrom(
  fedFrom: Pick<FedFrom, 'systemId' | 'nodeId'>,
  unitSystem: SystemDocument['unitSystem'],
  cold: ColdSupplyView | null,
): Resolution {
  if (cold === null || cold.systemId !== fedFrom.systemId) {
    return unresolved(
      'cold-system-missing',
      'The cold-water system this hot system is fed from is not in the project (deleted, or never chosen): choose the cold system and the node that feeds the heater.',
    );
  }
  if (cold.service !== 'cold') {
    return unresolved('cold-system-not-cold', `"${cold.name}" is a hot-water system: a hot system is fed from a cold-water system.`);
  }
  const rev = cold.revision;
  if (rev === null || !rev.analysis.ok) {
    const why = rev !== null && !rev.analysis.ok && rev.analysis.error?.message ? ` (${rev.analysis.error.message})` : '';
    return unresolved('cold-analysis-missing', `The cold system "${cold.name}" cannot be computed yet${why}: its pressure at the heater feed is unknown.`);
  }
  const a = rev.analysis.analysis;
  const i = a.si.nodes.findIndex((n) => n.id === fedFrom.nodeId);
  if (i < 0) {
    return unresolved('cold-node-missing', `The cold system "${cold.name}" has no node "${fedFrom.nodeId}": choose its node that feeds the heater.`);
  }
  const node = a.si.nodes[i];
  const closedBy = closingElementsUpstream(a, fedFrom.nodeId, rev.document);
  return {
    status: 'resolved',
    systemName: cold.name,
    nodeLabel: a.nodes[i]?.label || node.id,
    revisionNumber: rev.number,
    revisionStatus: rev.status,
    // The pressure unit of the hot document (the cold one may use the other unit system).
    residualPressure: Math.max(0, fromSI('pressure', node.pressure, unitSystem)),
    staticPressureHigh: Math.max(0, fromSI('pressure', node.staticPressureHigh, unitSystem)),
    ...(closedBy.length > 0 ? { closedBy } : {}),
  };
}

/** The words of the source's pressure basis for a resolved supply. */
export function fedFromBasis(r: Extract<Resolution, { status: 'resolved' }>): string {
  return `Fed from the cold-water system "${r.systemName}" at ${r.nodeLabel} (revision ${r.revisionNumber}, ${r.revisionStatus}): its residual pressure at design flow and its high static pressure there, from its analysis`;
}

/**
 * The hot document with its supply resolved from the cold system; the same object when nothing
 * changes (so a caller can tell whether to save), and unchanged for a document not fed from a system.
 */
export function applyFedFrom(doc: SystemDocument, cold: ColdSupplyView | null): SystemDocument {
  const fedFrom = doc.source.fedFrom;
  if (!fedFrom) return doc;
  const resolution = resolveFedFrom(fedFrom, doc.unitSystem, cold);
  const source = { ...doc.source, fedFrom: { systemId: fedFrom.systemId, nodeId: fedFrom.nodeId, resolution } };
  if (resolution.status === 'resolved') {
    source.staticPressureLow = resolution.residualPressure;
    source.staticPressureHigh = resolution.staticPressureHigh;
    source.pressureBasis = fedFromBasis(resolution).slice(0, 1000);
    // The pressure at design flow is the cold analysis' residual: a flow test of the hot source does not apply.
    delete source.flowTest;
  }
  const next = { ...doc, source };
  return JSON.stringify(next.source) === JSON.stringify(doc.source) ? doc : next;
}
