/**
 * The rows of the summary's larger tables, decided apart from drawing: the segment table with its
 * friction and fitting losses, and the pressure ledger of every checked fixture (the appendix).
 * Every number is taken from the analysis (src/engine/analysis); nothing hydraulic is computed here.
 * Elements are named as the user typed them, never by an internal id.
 */
import { ledgerFor, type Analysis, type SystemDocument } from '../../src/engine';
import { zoneFeedWords, zoneFloorsWords, zoneVerdictWords } from '../../src/shared/format/zoneWords';
import { MATERIALS } from '../../src/engine/catalog/materials';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { fittingLabel } from '../../src/engine/model/labels';
import { num, signed } from '../../src/shared/format/quantity';

/**
 * Names of nodes and segments as the user typed them: the label, else the id the user typed in the
 * document (the walk shows that same fallback); an id Headroom generated (a UUID) is never printed:
 * such a pipe is "pipe from A to B" and such a node is named by the fixture checked there.
 */
export interface Names {
  node(id: string): string;
  segment(id: string): string;
}

/** A UUID (or a placement's expansion of one): made by Headroom, never typed by the user. */
const GENERATED_ID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

export function namesOf(a: Analysis, doc: SystemDocument): Names {
  const nodeLabels = new Map<string, string>();
  for (const n of doc.nodes) if (n.label) nodeLabels.set(n.id, n.label);
  for (const n of a.nodes) if (n.label) nodeLabels.set(n.id, n.label);
  const fixtureAt = new Map<string, string>();
  for (const f of a.fixtures) if (!fixtureAt.has(f.nodeId)) fixtureAt.set(f.nodeId, f.label);
  const node = (id: string): string => {
    const label = nodeLabels.get(id);
    if (label) return label;
    if (!GENERATED_ID.test(id)) return id;
    if (id === doc.source.nodeId) return 'the source';
    const fixture = fixtureAt.get(id);
    return fixture ? `the node of ${fixture}` : 'an unnamed node';
  };
  const segLabels = new Map<string, string>();
  for (const s of doc.segments) if (s.label) segLabels.set(s.id, s.label);
  const ends = new Map(a.segments.map((s) => [s.id, s] as const));
  const segment = (id: string): string => {
    const label = segLabels.get(id) ?? ends.get(id)?.label;
    if (label) return label;
    if (!GENERATED_ID.test(id)) return id;
    const s = ends.get(id) ?? doc.segments.find((x) => x.id === id);
    return s ? `pipe from ${node(s.from)} to ${node(s.to)}` : 'an unnamed pipe';
  };
  return { node, segment };
}

/**
 * The length a friction gradient is printed per: 100 ft in US units (the basis of US pipe-sizing
 * friction charts, common practice) and 10 m in SI (the same order of length; a Headroom choice).
 */
export function frictionBasis(unitSystem: 'US' | 'SI'): { per: number; label: string } {
  return unitSystem === 'US' ? { per: 100, label: '100 ft' } : { per: 10, label: '10 m' };
}

export interface SegmentRow {
  name: string;
  material: string;
  size: string;
  innerDiameter: string;
  length: string;
  rise: string;
  fittings: string;
  sumK: string;
  flow: string;
  velocity: string;
  frictionLoss: string;
  frictionGradient: string;
  fittingLoss: string;
  velocityOver: boolean;
}

/** One row per segment: flow, velocity, Σ K, and the friction and fitting losses of the analysis. */
export function segmentRows(a: Analysis, doc: SystemDocument, names: Names = namesOf(a, doc)): SegmentRow[] {
  const u = a.units;
  const basis = frictionBasis(a.unitSystem);
  const docSeg = new Map(doc.segments.map((s) => [s.id, s]));
  return a.segments.map((s) => {
    const d = docSeg.get(s.id);
    // the catalog label without its parenthesis: "PEX tubing, SDR 9 (copper tube size)" → "PEX tubing, SDR 9"
    const material = d?.material ? (MATERIALS[d.material as keyof typeof MATERIALS]?.label ?? d.material).replace(/\s*\(.*\)\s*$/, '') : 'custom pipe';
    const fittings = (d?.fittings ?? [])
      .map((f) => `${f.count}× ${f.custom ? fittingLabel(f, u.length) : (FITTING_TYPES[f.typeId]?.label ?? f.typeId)}`)
      .join('; ');
    return {
      name: names.segment(s.id),
      material,
      size: d?.size ?? '—',
      innerDiameter: num(s.innerDiameter, u.diameter),
      length: num(s.length, u.length),
      rise: num(s.rise, u.elevation),
      fittings: fittings || 'none',
      sumK: num(s.totalK, 'loss coefficient'),
      flow: num(s.designFlow, u.flow),
      velocity: num(s.velocity, u.velocity),
      frictionLoss: num(s.frictionLoss, u.pressure),
      // the analysis's own friction loss spread over its length (no hydraulics here)
      frictionGradient: s.length > 0 ? num((s.frictionLoss / s.length) * basis.per, u.pressure) : '—',
      fittingLoss: num(s.fittingLoss, u.pressure),
      velocityOver: s.velocityPass === false,
    };
  });
}

export interface LedgerSegmentRow {
  segment: string;
  devices: string;
  friction: string;
  fittings: string;
  elevation: string;
  pressureAfter: string;
}

export interface FixtureLedger {
  fixtureId: string;
  title: string;
  critical: boolean;
  /** "the ledger of X up to segment Y": the rows shared with an earlier ledger of the appendix, not repeated */
  carried: { from: string; after: string; pressure: string } | null;
  start: string | null;
  rows: LedgerSegmentRow[];
  residual: string;
  required: string;
  margin: string;
  pass: boolean;
}

/**
 * The ledger of every checked fixture, one row per segment of its path (devices, friction,
 * fittings, elevation, the pressure after), from the engine's own ledger. Fixtures are ordered
 * along the piping (a depth-first order of their paths) so that consecutive ledgers share their
 * start; the shared rows are printed once and the next ledger carries on from them, naming where.
 * The critical fixture's ledger is printed in full in the body, so `exclude` leaves it out here.
 */
export function fixtureLedgers(a: Analysis, doc: SystemDocument, opts: { exclude?: string | null; names?: Names } = {}): FixtureLedger[] {
  const names = opts.names ?? namesOf(a, doc);
  const P = (v: number) => num(v, a.units.pressure);
  const order = new Map(a.segments.map((s, i) => [s.id, i]));
  const fixtures = a.fixtures
    .filter((f) => f.id !== opts.exclude)
    .map((f, i) => ({ f, i, key: f.path.map((id) => order.get(id) ?? -1) }))
    .sort((x, y) => {
      for (let k = 0; k < Math.min(x.key.length, y.key.length); k++) if (x.key[k] !== y.key[k]) return x.key[k] - y.key[k];
      return x.key.length - y.key.length || x.i - y.i;
    });
  const printed: { label: string; path: string[] }[] = [];
  return fixtures.map(({ f }) => {
    const ledger = ledgerFor(a, f.id);
    // the longest start of this path already printed in full by an earlier ledger of the appendix
    let shared = 0;
    let from: string | null = null;
    for (const p of printed) {
      let k = 0;
      while (k < p.path.length && k < f.path.length && p.path[k] === f.path[k]) k++;
      if (k > shared) {
        shared = k;
        from = p.label;
      }
    }
    // never carry the whole path: a ledger always prints at least its last segment
    if (shared >= f.path.length) shared = f.path.length - 1;
    const bySegment = new Map<string, { devices: number[]; friction: number; fittings: number; rise: number; after: number }>();
    for (const l of ledger.lines) {
      if (!l.segmentId) continue;
      const r = bySegment.get(l.segmentId) ?? { devices: [], friction: 0, fittings: 0, rise: 0, after: 0 };
      if (l.kind === 'device') r.devices.push(l.change);
      else if (l.kind === 'friction') r.friction = l.change;
      else if (l.kind === 'fittings') r.fittings = l.change;
      else if (l.kind === 'rise') r.rise = l.change;
      r.after = l.pressureAfter;
      bySegment.set(l.segmentId, r);
    }
    const deviceNames = new Map<string, string[]>();
    for (const l of ledger.lines)
      if (l.kind === 'device' && l.segmentId)
        deviceNames.set(l.segmentId, [...(deviceNames.get(l.segmentId) ?? []), `${l.label} ${signed(l.change, a.units.pressure)}`]);
    const rows = f.path.slice(shared).map((id) => {
      const r = bySegment.get(id)!;
      return {
        segment: names.segment(id),
        devices: (deviceNames.get(id) ?? []).join('; '),
        friction: signed(r.friction, a.units.pressure),
        fittings: signed(r.fittings, a.units.pressure),
        elevation: signed(r.rise, a.units.pressure),
        pressureAfter: P(r.after),
      };
    });
    const carried = shared > 0 && from ? { from, after: names.segment(f.path[shared - 1]), pressure: P(bySegment.get(f.path[shared - 1])!.after) } : null;
    printed.push({ label: f.label, path: f.path });
    return {
      fixtureId: f.id,
      title: `${f.label} at ${names.node(f.nodeId)}`,
      critical: f.id === a.criticalFixtureId,
      carried,
      start: carried ? null : `${ledger.lines[0].label}: ${P(ledger.lines[0].pressureAfter)}`,
      rows,
      residual: P(ledger.residual),
      required: P(ledger.required),
      margin: signed(ledger.margin, a.units.pressure),
      pass: ledger.pass,
    };
  });
}

export interface ZoneRow {
  name: string;
  fedBy: string;
  floors: string;
  highestResidual: string;
  lowestResidual: string;
  highestStatic: string;
  staticPass: boolean | null;
  critical: string;
  verdict: string;
  status: string;
}

/**
 * One row per pressure zone (analysis/zones.ts): the feed, the floors, the highest and lowest
 * residual and where, the highest static against the maximum, the critical fixture with its margin,
 * and the verdict in words. An analysis stored before zones existed has none (an empty list).
 */
export function zoneRows(a: Analysis): ZoneRow[] {
  const u = a.units;
  return (a.zones ?? []).map((z) => ({
    name: z.name,
    fedBy: zoneFeedWords(z, u.pressure),
    floors: zoneFloorsWords(z, u.elevation),
    highestResidual: z.highestResidual ? `${num(z.highestResidual.pressure, u.pressure)} at ${z.highestResidual.where}` : '—',
    lowestResidual: z.lowestResidual ? `${num(z.lowestResidual.pressure, u.pressure)} at ${z.lowestResidual.where}` : '—',
    highestStatic: z.highestStatic
      ? `${num(z.highestStatic.pressure, u.pressure)} at ${z.highestStatic.where}: ${z.highestStatic.pass ? 'within' : 'OVER'} the ${num(z.highestStatic.maximum, u.pressure)} maximum`
      : 'no fixture served',
    staticPass: z.highestStatic ? z.highestStatic.pass : null,
    critical: z.criticalFixture ? `${z.criticalFixture.label}, margin ${signed(z.criticalFixture.margin, u.pressure)}` : '—',
    verdict: zoneVerdictWords(z),
    status: z.status,
  }));
}
