/**
 * Generated system documents for tests and the benchmark (pure; the random source is passed in).
 *
 * - generateBuilding: a tall building — a copper riser with one segment per storey and, on each
 *   storey, a floor main to apartments, each with its own branch tree to the fixtures
 *   (125 segments per storey; 40 storeys → 5,000 segments).
 * - generateRandomTree: a random tree of custom pipes with fixed (continuous) demands, sized for
 *   turbulent flow, for the EPANET cross-check and the property tests.
 *
 * The data are invented; they exercise the engine and are not a design.
 */
import type { SystemDocumentInput } from '../model/schema';

/** A seeded generator of uniform numbers in [0, 1): Mulberry32 (T. Ettinger, public domain). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface BuildingOptions {
  storeys: number;
  apartmentsPerStorey?: number;
  /** Storey height, ft. 10 ft is a common floor-to-floor height for apartments (common practice). */
  storeyHeightFt?: number;
}

/**
 * A US-units building on a utility main. Per storey: 1 riser segment, `apartments` floor-main
 * segments, and per apartment 6 apartment-main segments each with 4 fixture branches (30).
 * With 4 apartments: 1 + 4 + 4·30 = 125 segments per storey.
 */
export function generateBuilding(opts: BuildingOptions): SystemDocumentInput {
  const storeys = opts.storeys;
  const apartments = opts.apartmentsPerStorey ?? 4;
  const h = opts.storeyHeightFt ?? 10;
  const nodes: SystemDocumentInput['nodes'] = [{ id: 'main', label: 'Utility main', elevation: 0 }];
  // Positions in all three ways of document version 2: the riser and floor mains on named floors,
  // the fixture outlets by the typed rise of their branch.
  const floors: NonNullable<SystemDocumentInput['floors']> = [];
  const segments: SystemDocumentInput['segments'] = [];
  const fixtureCycle = ['lavatory-private', 'kitchen-sink-private', 'lavatory-private', 'water-closet-flush-tank-private'];
  const devices: NonNullable<SystemDocumentInput['devices']> = [];
  let below = 'main';
  for (let f = 1; f <= storeys; f++) {
    const riserNode = `r${f}`;
    const z = f * h;
    floors.push({ id: `L${f}`, name: `Level ${f}`, elevation: z });
    nodes.push({ id: riserNode, floor: `L${f}` });
    // Riser size steps down toward the top (invented sizing for the benchmark).
    const riserSize = f <= storeys * 0.5 ? '6' : f <= storeys * 0.75 ? '5' : '4';
    segments.push({
      id: `riser-${f}`,
      from: below,
      to: riserNode,
      material: 'steel-sch40',
      size: riserSize,
      length: h,
      fittings: [{ typeId: 'tee-run', count: 1 }],
    });
    below = riserNode;
    let mainFrom = riserNode;
    for (let a = 1; a <= apartments; a++) {
      const mainNode = `f${f}-m${a}`;
      nodes.push({ id: mainNode, floor: `L${f}`, heightAboveFloor: 0 });
      segments.push({
        id: `floor-${f}-${a}`,
        from: mainFrom,
        to: mainNode,
        material: 'copper-l',
        size: a <= 2 ? '1-1/2' : '1-1/4',
        length: 20,
        fittings: [{ typeId: 'tee-run', count: 1 }],
      });
      if (a === 1) {
        // A floor PRV on each storey (common practice in towers): static within the maximum.
        devices.push({
          id: `prv-${f}`,
          kind: 'prv',
          label: `Floor ${f} PRV`,
          segmentId: `floor-${f}-1`,
          loss: { kind: 'fixed', loss: 0 },
          prv: { setPressure: 65, falloffPerFlow: 0.02 },
        });
      }
      mainFrom = mainNode;
      let aptFrom = mainNode;
      for (let b = 1; b <= 6; b++) {
        const aptNode = `f${f}-a${a}-n${b}`;
        nodes.push({ id: aptNode, floor: `L${f}` });
        segments.push({
          id: `apt-${f}-${a}-${b}`,
          from: aptFrom,
          to: aptNode,
          material: 'pex-sdr9',
          size: '1-1/4',
          length: 8,
          fittings: [{ typeId: b === 1 ? 'tee-branch' : 'tee-run', count: 1 }],
        });
        aptFrom = aptNode;
        for (let c = 1; c <= 4; c++) {
          const fixNode = `f${f}-a${a}-n${b}-x${c}`;
          const typeId = fixtureCycle[(b + c) % fixtureCycle.length];
          const last = b === 6 && c === 4;
          nodes.push({
            id: fixNode,
            fixtureGroups: [{ fixtureTypeId: typeId, count: 1 }],
            checkedFixtures: last ? [{ id: `fx-${f}-${a}`, fixtureTypeId: typeId }] : [],
          });
          segments.push({
            id: `fb-${f}-${a}-${b}-${c}`,
            from: aptNode,
            to: fixNode,
            material: 'pex-sdr9',
            size: typeId.startsWith('water-closet') ? '3/4' : '1/2',
            length: 6,
            rise: 3,
            fittings: [
              { typeId: 'elbow-90-standard', count: 2 },
              { typeId: 'tee-branch', count: 1 },
            ],
          });
        }
      }
    }
  }
  return {
    schemaVersion: 2,
    id: `generated-${storeys}-storeys`,
    name: `Generated ${storeys}-storey building`,
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 55,
    source: {
      kind: 'utility-main',
      nodeId: 'main',
      // Invented pressures high enough for the height (a real tower would be zoned with PRVs/boosters).
      staticPressureLow: 40 + 0.45 * h * storeys,
      staticPressureHigh: 50 + 0.45 * h * storeys,
      pressureBasis: 'generated for the benchmark',
    },
    devices,
    floors,
    nodes,
    segments,
  };
}

export interface RandomTreeOptions {
  segments: number;
  unitSystem?: 'SI';
  /** Fittings from the catalog to scatter on the segments (type ids). */
  fittingTypes?: readonly string[];
  frictionMethod?: 'colebrook' | 'swamee-jain' | 'churchill-1977' | 'hazen-williams';
  sourcePressureKPa?: number;
  /** Minimum Reynolds number to size for (EPANET uses Swamee–Jain only above 4000). */
  minReynolds?: number;
}

/**
 * A random tree in SI units: each new node hangs from the previous node or from any earlier one; each leaf and some inner nodes draw a fixed demand; each
 * segment is sized for a random velocity of 0.6–2.4 m/s at its accumulated flow and enlarged
 * only if needed, then shrunk if its Reynolds number would be below minReynolds.
 */
export function generateRandomTree(rng: () => number, opts: RandomTreeOptions): SystemDocumentInput {
  const n = opts.segments;
  const parentOf = new Int32Array(n + 1).fill(-1);
  for (let i = 1; i <= n; i++) {
    // 30 %: continue the latest run (long paths); 70 %: hang from any earlier node (bushy).
    parentOf[i] = rng() < 0.3 ? i - 1 : Math.floor(rng() * i);
  }
  const demandLs = new Float64Array(n + 1);
  const childCount = new Int32Array(n + 1);
  for (let i = 1; i <= n; i++) childCount[parentOf[i]]++;
  for (let i = 1; i <= n; i++) {
    if (childCount[i] === 0 || rng() < 0.3) demandLs[i] = 0.05 + rng() * 0.45; // L/s
  }
  // Accumulated flow per node (children have larger indices than parents).
  const flowLs = Float64Array.from(demandLs);
  for (let i = n; i >= 1; i--) flowLs[parentOf[i]] += flowLs[i];
  const rise = new Float64Array(n + 1);
  for (let i = 1; i <= n; i++) rise[i] = Math.round((-4 + rng() * 8) * 1000) / 1000;
  const nu = 1.3e-6; // ~10 °C water, m²/s (IAPWS via water.ts gives 1.306e-6; only a sizing aid)
  const minRe = opts.minReynolds ?? 5000;
  const fittingTypes = opts.fittingTypes ?? [];
  const nodes: SystemDocumentInput['nodes'] = [];
  const segments: SystemDocumentInput['segments'] = [];
  nodes.push({ id: 'n0', elevation: 0 });
  for (let i = 1; i <= n; i++) {
    // Placed by the typed rise of the feed segment (document version 2): no elevation of its own.
    nodes.push({ id: `n${i}`, ...(demandLs[i] > 0 ? { continuousDemand: demandLs[i] } : {}) });
    const Q = flowLs[i] / 1000;
    const V = 0.6 + rng() * 1.8;
    let D = Math.sqrt((4 * Q) / (Math.PI * V));
    const dMaxForRe = (4 * Q) / (Math.PI * nu * minRe);
    if (D > dMaxForRe) D = dMaxForRe;
    // Within the plausible inside diameters (model/limits.ts: 2.5–600 mm); a trunk carrying a
    // whole large tree is capped at 600 mm (its velocity then rises above the target).
    D = Math.min(Math.max(D, 0.004), 0.6);
    const fittings: { typeId: string; count: number }[] = [];
    for (const t of fittingTypes) if (rng() < 0.35) fittings.push({ typeId: t, count: 1 + Math.floor(rng() * 3) });
    segments.push({
      id: `s${i}`,
      from: `n${parentOf[i]}`,
      to: `n${i}`,
      custom: {
        innerDiameter: Math.round(D * 1e6) / 1000, // mm, to 1 µm
        roughness: 0.0015 + rng() * 0.05, // mm: drawn tubing to commercial steel (REFERENCES §4)
        hazenWilliamsC: 100 + Math.floor(rng() * 51),
        velocityClass: 'plastic',
      },
      length: Math.round((0.5 + rng() * 30) * 1000) / 1000,
      rise: rise[i],
      fittings,
      reducerAuto: false,
    });
  }
  return {
    schemaVersion: 2,
    id: `random-tree-${n}`,
    name: `Random tree of ${n} segments`,
    service: 'cold',
    unitSystem: 'SI',
    waterTemperature: 10,
    source: {
      kind: 'utility-main',
      nodeId: 'n0',
      staticPressureLow: opts.sourcePressureKPa ?? 600,
      staticPressureHigh: opts.sourcePressureKPa ?? 600,
      pressureBasis: 'generated',
    },
    devices: [],
    nodes,
    segments,
    criteria: { frictionMethod: opts.frictionMethod ?? 'swamee-jain' },
  };
}
