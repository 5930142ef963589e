/**
 * Sizing inside typical units (sizeSystem.ts, "Typical units"): small invented buildings — a riser
 * on up to three floors, one or two unit types, 2–4 placements on different floors, some with a
 * length override — sized, and every size assignment (the main tree's segments and each unit
 * type's segments, one size for all placements) analysed by the engine. The sizing's answer must
 * pass and, when its first verification passed (no size-change repair), have the least volume of
 * all passing assignments: the documents start with every pipe at one size, so the search's model
 * (no size-change loss) can only under-count the losses, and an answer it verifies is the least.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema, type SystemDocumentInput } from '../../../src/engine';
import { MATERIALS } from '../../../src/engine/catalog/materials';
import { sizeSystem, SizingError, unitTypeSegmentKey, type SizingResult } from '../../../src/engine/sizing/sizeSystem';
import { expandBuilding } from '../../../src/engine/building/expand';
import { M_PER_FT, PA_PER_PSI } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';
import { mulberry32 } from '../../../src/engine/testing/generateTree';

/** Every generated case is reproducible from its seed. */
const rng = mulberry32;

const MAIN_SIZES = ['3/4', '1', '1-1/4', '1-1/2'];
const UNIT_SIZES = ['1/2', '3/4', '1'];
/** Every pipe starts at this size, so the starting document has no size change anywhere. */
const START = '1';

type UnitTypeInput = NonNullable<SystemDocumentInput['unitTypes']>[number];
type PlacementInput = NonNullable<SystemDocumentInput['placements']>[number];

interface Building {
  doc: SystemDocumentInput;
  /** Candidate sizes by segment id, unit type segments by unitTypeSegmentKey. */
  candidates: Record<string, string[]>;
}

function unitTypeA(r: () => number): UnitTypeInput {
  return {
    id: 'type-a',
    name: 'Unit A',
    nodes: [
      { id: 'm', label: 'manifold', heightAboveFloor: 8 },
      {
        id: 'a',
        label: 'shower',
        heightAboveFloor: 6,
        fixtureGroups: [{ fixtureTypeId: 'shower-private', count: 1 + Math.floor(r() * 3) }],
        checkedFixtures: [{ id: 'shower', fixtureTypeId: 'shower-private', label: 'shower' }],
      },
      {
        id: 'b',
        label: 'sink',
        heightAboveFloor: 2,
        fixtureGroups: [{ fixtureTypeId: 'kitchen-sink-private', count: 1 + Math.floor(r() * 2) }],
        checkedFixtures: [{ id: 'sink', fixtureTypeId: 'kitchen-sink-private', label: 'sink' }],
      },
    ],
    segments: [
      {
        id: 'br',
        label: 'branch',
        from: 'inlet',
        to: 'm',
        material: 'copper-l',
        size: START,
        length: 10 + Math.round(r() * 30),
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      },
      {
        id: 'la',
        label: 'to shower',
        from: 'm',
        to: 'a',
        material: 'copper-l',
        size: START,
        length: 8 + Math.round(r() * 20),
        fittings: [{ typeId: 'elbow-90-standard', count: 3 }],
      },
      {
        id: 'lb',
        label: 'to sink',
        from: 'm',
        to: 'b',
        material: 'copper-l',
        size: START,
        length: 8 + Math.round(r() * 20),
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      },
    ],
  };
}

function unitTypeB(r: () => number): UnitTypeInput {
  return {
    id: 'type-b',
    name: 'Unit B',
    nodes: [
      { id: 'x', label: 'valve', heightAboveFloor: 7 },
      {
        id: 'y',
        label: 'lavatory',
        heightAboveFloor: 3,
        fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 2 + Math.floor(r() * 3) }],
        checkedFixtures: [{ id: 'lav', fixtureTypeId: 'lavatory-private', label: 'lavatory' }],
      },
    ],
    segments: [
      {
        id: 'bx',
        label: 'branch',
        from: 'inlet',
        to: 'x',
        material: 'copper-l',
        size: START,
        length: 10 + Math.round(r() * 30),
        fittings: [{ typeId: 'tee-branch', count: 1 }],
      },
      {
        id: 'xy',
        label: 'to lavatory',
        from: 'x',
        to: 'y',
        material: 'copper-l',
        size: START,
        length: 8 + Math.round(r() * 20),
        fittings: [{ typeId: 'elbow-90-standard', count: 2 }],
      },
    ],
  };
}

/** Two adjacent catalog sizes from a list, chosen at random. */
function pair(r: () => number, sizes: readonly string[]): string[] {
  const first = Math.floor(r() * (sizes.length - 1));
  return sizes.slice(first, first + 2);
}

/** An invented building of the seed: riser floors, unit types, placements (some with an override). */
function building(seed: number, pressurePsi = 60): Building {
  const r = rng(seed);
  const storeys = 2 + Math.floor(r() * 2);
  const floors = Array.from({ length: 4 }, (_, k) => ({ id: `l${k + 1}`, name: `Level ${k + 1}`, elevation: 10 * k }));
  const nodes: SystemDocumentInput['nodes'] = [{ id: 'main', label: 'main', elevation: 0 }];
  const segments: SystemDocumentInput['segments'] = [];
  const candidates: Record<string, string[]> = {};
  for (let k = 1; k <= storeys; k++) {
    nodes.push({ id: `r${k}`, label: `riser at level ${k}`, floor: `l${k}`, heightAboveFloor: 9 });
    segments.push({
      id: `riser-${k}`,
      label: `riser to level ${k}`,
      from: k === 1 ? 'main' : `r${k - 1}`,
      to: `r${k}`,
      material: 'copper-l',
      size: START,
      length: k === 1 ? 20 + Math.round(r() * 20) : 10,
      fittings: [{ typeId: 'tee-run', count: 1 }],
      reducerAuto: false,
    });
    candidates[`riser-${k}`] = pair(r, MAIN_SIZES);
  }
  const twoTypes = seed % 2 === 0;
  const unitTypes = twoTypes ? [unitTypeA(r), unitTypeB(r)] : [unitTypeA(r)];
  for (const t of unitTypes) for (const s of t.segments) candidates[unitTypeSegmentKey(t.id, s.id)] = pair(r, UNIT_SIZES);
  const count = twoTypes ? 4 : 2 + Math.floor(r() * 3);
  const placements: PlacementInput[] = Array.from({ length: count }, (_, k) => {
    const floor = 1 + (k % storeys);
    const type = twoTypes && k >= 2 ? unitTypes[1] : unitTypes[0];
    const p: PlacementInput = { id: `u${k + 1}`, unitTypeId: type.id, label: `Unit ${k + 1}`, floor: `l${floor}`, at: `r${floor}` };
    // every other placement overrides a length: its copies lose differently from the rest
    if (k % 2 === 1) p.overrides = { segments: { [type.segments.at(-1)!.id]: { length: 5 + Math.round(r() * 40) } } };
    return p;
  });
  const doc: SystemDocumentInput = {
    schemaVersion: 2,
    id: `units-${seed}`,
    name: `Building with typical units ${seed} (invented)`,
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'main', staticPressureLow: pressurePsi, staticPressureHigh: Math.max(pressurePsi, 70), pressureBasis: 'invented' },
    floors,
    nodes,
    segments,
    unitTypes,
    placements,
  };
  return { doc, candidates };
}

/** The decisions of a building: the main segments, then every unit type's segments. */
function decisions(b: Building): { key: string; sizes: string[] }[] {
  return Object.entries(b.candidates).map(([key, sizes]) => ({ key, sizes }));
}

function withSizes(b: Building, pick: Record<string, string>): SystemDocumentInput {
  return {
    ...b.doc,
    segments: b.doc.segments.map((s) => ({ ...s, size: pick[s.id] ?? s.size })),
    unitTypes: b.doc.unitTypes!.map((t) => ({ ...t, segments: t.segments.map((s) => ({ ...s, size: pick[unitTypeSegmentKey(t.id, s.id)] ?? s.size })) })),
  };
}

const area = (size: string) => (Math.PI * MATERIALS['copper-l'].sizes.find((z) => z.key === size)!.innerDiameterM ** 2) / 4;

/** Pipe volume of the main tree and of every placement's copies (each with its own length), m³. */
function volume(doc: SystemDocumentInput): number {
  let v = doc.segments.reduce((sum, s) => sum + s.length * M_PER_FT * area(s.size!), 0);
  for (const p of doc.placements!) {
    const t = doc.unitTypes!.find((u) => u.id === p.unitTypeId)!;
    for (const s of t.segments) v += (p.overrides?.segments?.[s.id]?.length ?? s.length) * M_PER_FT * area(s.size!);
  }
  return v;
}

function passes(doc: SystemDocumentInput, marginPsi: number): boolean {
  const a = analyzeSystem(doc);
  return a.fixtures.every((f) => f.residual - f.required >= marginPsi - 1e-9) && a.segments.every((s) => s.velocityPass !== false);
}

/** Every assignment, each analysed in full: the least volume that passes, or null. */
function exhaustive(b: Building, marginPsi: number): { best: number | null; analysed: number } {
  const list = decisions(b);
  let best: number | null = null;
  let analysed = 0;
  const pick: Record<string, string> = {};
  const walk = (i: number) => {
    if (i === list.length) {
      const doc = withSizes(b, pick);
      analysed++;
      if (passes(doc, marginPsi)) {
        const v = volume(doc);
        if (best === null || v < best) best = v;
      }
      return;
    }
    for (const size of list[i].sizes) {
      pick[list[i].key] = size;
      walk(i + 1);
    }
  };
  walk(0);
  return { best, analysed };
}

/** A supply pressure halfway between what the all-smallest and the all-largest assignments need. */
function interestingPressure(b: Building): number {
  const worst = (end: 0 | 1) => {
    const pick = Object.fromEntries(decisions(b).map((d) => [d.key, d.sizes[end]]));
    return Math.min(...analyzeSystem(withSizes(b, pick)).fixtures.map((f) => f.margin));
  };
  return Math.max(20, Math.min(150, 60 - (worst(0) + worst(1)) / 2));
}

describe('sizeSystem with typical units: the least volume, proved against every assignment', () => {
  const SEEDS = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
  let proven = 0;
  let feasible = 0;
  for (const seed of SEEDS) {
    it(`building ${seed}: the sizing passes and, when verified at once, equals the exhaustive minimum`, () => {
      const b = building(seed, interestingPressure(building(seed)));
      const marginPsi = seed % 3 === 0 ? 2 : 0;
      const { best, analysed } = exhaustive(b, marginPsi);
      expect(analysed).toBeGreaterThanOrEqual(16);
      const result = sizeSystem(b.doc, { candidateSizes: b.candidates, marginPa: marginPsi * PA_PER_PSI });
      if (best === null) {
        expect(result.feasible).toBe(false);
        expect(result.document).toBeNull();
        return;
      }
      expect(result.feasible).toBe(true);
      feasible++;
      const sized = result.document as SystemDocumentInput;
      expect(passes(sized, marginPsi)).toBe(true);
      // the answer's volume is the sized document's own (every copy with its own length); round-off only
      expectClose(result.volumeAfterM3!, volume(sized), { rtol: 1e-9 }, 'volume of the sized document');
      expect(result.unitPiping!.leastProven).toBe(true);
      // base + one probe analysis + one verification: no repair, so the answer is the least
      if (result.analyses === 3) {
        proven++;
        expectClose(result.volumeAfterM3!, best, { rtol: 1e-9 }, 'least volume');
      } else {
        expect(result.volumeAfterM3!).toBeGreaterThanOrEqual(best * (1 - 1e-9));
      }
      // one row per unit type segment, applying to every placement of its type
      for (const t of b.doc.unitTypes!) {
        const rows = result.segments.filter((s) => s.unitType?.id === t.id);
        expect(rows.length).toBe(t.segments.length);
        const n = b.doc.placements!.filter((p) => p.unitTypeId === t.id).length;
        for (const row of rows) expect(row.unitType!.placements).toBe(n);
      }
    });
  }
  it('most buildings have an answer and are proven least (the check above is not vacuous)', () => {
    console.log(`typical units: ${feasible} of ${SEEDS.length} buildings sized, ${proven} proven least against every assignment`);
    expect(feasible).toBeGreaterThanOrEqual(SEEDS.length / 2);
    expect(proven).toBeGreaterThanOrEqual(feasible / 2);
  });
});

describe('sizeSystem with typical units: locks and selections name the unit type segment', () => {
  const b = building(4, interestingPressure(building(4)));
  const key = unitTypeSegmentKey('type-a', 'br');

  it('when a unit type segment is locked, then it keeps its size in the unit type and is reported as locked', () => {
    const result = sizeSystem(b.doc, { candidateSizes: b.candidates, lockedSegmentIds: [key] });
    const row = result.segments.find((s) => s.segmentId === key)!;
    expect(row.governing).toBe('locked');
    expect(row.after).toBe(START);
    if (result.document) expect(result.document.unitTypes![0].segments.find((s) => s.id === 'br')!.size).toBe(START);
  });

  it('when only a unit type segment is selected, then nothing else changes', () => {
    const result = sizeSystem(b.doc, { candidateSizes: b.candidates, segmentIds: [key] });
    for (const s of result.segments) if (s.segmentId !== key) expect(s.after).toBe(s.before);
  });

  it('when an option names an unknown unit type segment, then a named error', () => {
    expect(() => sizeSystem(b.doc, { lockedSegmentIds: [unitTypeSegmentKey('type-a', 'nope')] })).toThrow(/No segment "type-a\/nope"/);
  });
});

describe('sizeSystem with typical units: the lock stored on a unit type segment', () => {
  const b = building(4, interestingPressure(building(4)));
  /** The building with these unit type segments marked sizeLocked in the document (unit type id → segment ids). */
  const lockedIn = (doc: SystemDocumentInput, locks: Record<string, string[]>): SystemDocumentInput => ({
    ...doc,
    unitTypes: doc.unitTypes!.map((t) => ({ ...t, segments: t.segments.map((s) => (locks[t.id]?.includes(s.id) ? { ...s, sizeLocked: true } : s)) })),
  });
  /** The answer without its timings (the only part that differs between two runs of the same question). */
  const answerOf = (r: SizingResult) => ({ ...r, timings: null });

  it('when the unit type marks a segment sizeLocked, then it keeps its size in every placement, is reported locked, and the answer is the one an option lock gives', () => {
    // the segment the unlocked sizing changes, so that keeping it says something
    const free = sizeSystem(b.doc, { candidateSizes: b.candidates });
    const moved = free.segments.find((s) => s.unitType && s.after !== s.before);
    if (!moved) throw new Error('building 4 was expected to change a unit type segment when nothing is locked');
    const { id: typeId, segmentId } = moved.unitType!;
    const stored = sizeSystem(lockedIn(b.doc, { [typeId]: [segmentId] }), { candidateSizes: b.candidates });
    const row = stored.segments.find((s) => s.segmentId === moved.segmentId)!;
    expect(row.governing).toBe('locked');
    expect(row.after).toBe(START);
    expect(row.unitType!.placements).toBe(b.doc.placements!.filter((p) => p.unitTypeId === typeId).length);
    expect(stored.feasible).toBe(true);
    const sized = stored.document!;
    expect(sized.unitTypes!.find((t) => t.id === typeId)!.segments.find((s) => s.id === segmentId)!.size).toBe(START);
    // every placement's copy, as the analysis reads the sized document
    const expanded = expandBuilding(sized);
    const copies = b.doc.placements!.filter((p) => p.unitTypeId === typeId).map((p) => expanded.segments.find((s) => s.id === `${p.id}.${segmentId}`)!);
    expect(copies.length).toBe(row.unitType!.placements);
    for (const c of copies) expect(c.size).toBe(START);
    // the same answer as the lock given as an option (the panel's way before the lock was stored)
    const asOption = sizeSystem(b.doc, { candidateSizes: b.candidates, lockedSegmentIds: [moved.segmentId] });
    expect(answerOf(stored)).toEqual({ ...answerOf(asOption), document: { ...asOption.document!, unitTypes: sized.unitTypes } });
    expect(stored.segments).toEqual(asOption.segments);
  });

  it('when every segment is locked, main tree and unit types, then the all-locked error names them and nothing is changed', () => {
    const locks = Object.fromEntries(b.doc.unitTypes!.map((t) => [t.id, t.segments.map((s) => s.id)]));
    const all = lockedIn({ ...b.doc, segments: b.doc.segments.map((s) => ({ ...s, sizeLocked: true })) }, locks);
    const copy = JSON.parse(JSON.stringify(all));
    const total = b.doc.segments.length + b.doc.unitTypes!.reduce((n, t) => n + t.segments.length, 0);
    let error: unknown = null;
    try {
      sizeSystem(all);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SizingError);
    expect((error as SizingError).code).toBe('all-locked');
    // the main tree's segments are named first, then the unit types' as their rows read; the rest counted
    const names = [...b.doc.segments.map((s) => s.label), ...b.doc.unitTypes!.flatMap((t) => t.segments.map((s) => `${t.name} · ${s.label}`))];
    expect((error as SizingError).message).toBe(
      `Every segment of the system is locked (${names
        .slice(0, 3)
        .map((n) => `"${n}"`)
        .join(', ')} and ${total - 3} more): nothing can be sized and nothing was changed. Unlock a segment or select others.`,
    );
    expect(all).toEqual(copy);
    // the main tree locked and the units free: the units are still sized
    const mainOnly = sizeSystem({ ...b.doc, segments: b.doc.segments.map((s) => ({ ...s, sizeLocked: true })) }, { candidateSizes: b.candidates });
    expect(mainOnly.segments.filter((s) => !s.unitType).every((s) => s.governing === 'locked')).toBe(true);
    expect(mainOnly.segments.some((s) => s.unitType && s.governing !== 'locked')).toBe(true);
    // a selection of only a locked unit type segment: the same error, naming it as its row does
    const one = lockedIn(b.doc, { 'type-a': ['br'] });
    expect(() => sizeSystem(one, { segmentIds: [unitTypeSegmentKey('type-a', 'br')] })).toThrow(
      'Every segment selected is locked ("Unit A · branch"): nothing can be sized and nothing was changed.',
    );
  });

  it('when a locked unit type is expanded, then every copy carries the lock, a placement overriding the size keeps its own size, and sizing the expanded document keeps them all', () => {
    const withOverride: SystemDocumentInput = {
      ...lockedIn(b.doc, { 'type-a': ['br'] }),
      placements: b.doc.placements!.map((p, k) => (k === 0 ? { ...p, overrides: { segments: { ...p.overrides?.segments, br: { size: '3/4' } } } } : p)),
    };
    const placedA = withOverride.placements!.filter((p) => p.unitTypeId === 'type-a');
    const expanded = expandBuilding(SystemDocumentSchema.parse(withOverride));
    const copies = placedA.map((p) => expanded.segments.find((s) => s.id === `${p.id}.br`)!);
    for (const c of copies) expect(c.sizeLocked).toBe(true);
    expect(copies.map((c) => c.size)).toEqual(placedA.map((p) => (p.id === withOverride.placements![0].id ? '3/4' : START)));
    // the other unit segments are not locked
    expect(expanded.segments.filter((s) => s.id.endsWith('.la')).every((s) => s.sizeLocked === undefined)).toBe(true);
    // the expanded document, its copies now ordinary segments, sized: each locked copy keeps the size it has
    const mainCandidates = Object.fromEntries(Object.entries(b.candidates).filter(([key]) => !key.includes('/')));
    const result = sizeSystem(expanded, { candidateSizes: mainCandidates });
    for (const c of copies) {
      const row = result.segments.find((s) => s.segmentId === c.id)!;
      expect(row.governing).toBe('locked');
      expect(row.after).toBe(c.size);
    }
  });
});

describe('sizeSystem with typical units: many kinds of placement', () => {
  it('when more placements differ than the classes searched apart, then they are merged on the safe side: the answer passes and is not claimed least', () => {
    // building 1 with ten placements of Unit A, each with its own shower-leg length: ten classes, beyond the bound of eight
    const b1 = building(1);
    const floors = b1.doc.segments.length;
    const placements: PlacementInput[] = Array.from({ length: 10 }, (_, k) => ({
      id: `m${k + 1}`,
      unitTypeId: 'type-a',
      label: `Unit M${k + 1}`,
      floor: `l${1 + (k % floors)}`,
      at: `r${1 + (k % floors)}`,
      overrides: { segments: { la: { length: 6 + 4 * k } } },
    }));
    const many = { ...b1, doc: { ...b1.doc, placements } };
    const b: Building = {
      ...many,
      doc: { ...many.doc, source: { ...many.doc.source, staticPressureLow: interestingPressure(many), staticPressureHigh: 150 } },
    };
    const { best } = exhaustive(b, 0);
    if (best === null) throw new Error('building 1 with ten placements was expected to have a passing assignment');
    const result = sizeSystem(b.doc, { candidateSizes: b.candidates });
    expect(result.feasible).toBe(true);
    expect(passes(result.document as SystemDocumentInput, 0)).toBe(true);
    expect(result.unitPiping!.leastProven).toBe(false);
    expect(result.volumeAfterM3!).toBeGreaterThanOrEqual(best * (1 - 1e-9));
    console.log(`ten kinds of placement: volume ${(result.volumeAfterM3! * 1000).toFixed(2)} L against the least ${(best * 1000).toFixed(2)} L`);
  });
});
