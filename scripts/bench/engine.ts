/**
 * Engine rows: the generated 40-storey, 5,000-segment building, a random 5,000-segment tree and
 * the demo building, through analyzeSystem (schema validation included) and through
 * analyzeValidated (a document already validated, as the live client re-runs it); the peer is
 * EPANET (epanet-js) solving the same 5,000-pipe tree — EN_solveH only, the network opened
 * beforehand (solve, not build). One row times the computation alone (SI model, topology,
 * demand, hydraulics, checks) without the report, to show where the time goes. The per-element
 * result objects (segments, nodes, fixtures, in SI and display units) are built when first read
 * (src/engine/analysis/results.ts); one more row reads every one of them after analyzeSystem, as
 * a consumer that serialises the whole analysis (the server's save) does, so that this work is
 * measured too rather than left out of the table.
 */
import { readFileSync } from 'node:fs';
import { analyzeSystem, SystemDocumentSchema, type Analysis } from '../../src/engine';
import { analyzeValidated } from '../../src/engine/analysis/analyze';
import { borrowPipes, buildModel } from '../../src/engine/analysis/input';
import { buildTopology } from '../../src/engine/analysis/topology';
import { resolveElevations } from '../../src/engine/analysis/elevations';
import { computeDemand } from '../../src/engine/analysis/demand';
import { computeHydraulics } from '../../src/engine/analysis/hydraulics';
import { runChecks } from '../../src/engine/analysis/checks';
import type { EngineWarning } from '../../src/engine/warnings';
import type { SystemDocument } from '../../src/engine/model/schema';
import { hazenWilliamsHeadLoss } from '../../src/engine/friction';
import { G } from '../../src/engine/units';
import { generateBuilding, generateRandomTree, mulberry32 } from '../../src/engine/testing/generateTree';
import { EpanetPeer, type PeerNetwork } from '../../tests/engine/support/epanet';
import { median, type BenchRow } from './table';

interface EngineCase {
  figure: string;
  run: () => void;
  peer?: { name: string; setup: () => Promise<void>; run: () => void; teardown: () => void };
  /** more runs for the small case: it is quick and noisier */
  repeatsFactor?: number;
  aim?: string;
}

function timeOnce(run: () => void): number {
  const t0 = performance.now();
  run();
  return performance.now() - t0;
}

/**
 * Medians of `repeats` timed calls of `run` and of `peer`, after a few untimed ones (JIT
 * warm-up), interleaved (ours, peer, peer, ours, …) so that a change in the machine's load
 * during the run falls on both.
 */
function timePair(run: () => void, peer: (() => void) | null, repeats: number): { ours: number; peer: number | null } {
  for (let i = 0; i < Math.min(5, repeats); i++) {
    run();
    peer?.();
  }
  const ours: number[] = [];
  const theirs: number[] = [];
  for (let i = 0; i < repeats; i++) {
    if (i % 2 === 0 || !peer) ours.push(timeOnce(run));
    if (peer) theirs.push(timeOnce(peer));
    if (i % 2 === 1 && peer) ours.push(timeOnce(run));
  }
  return { ours: median(ours), peer: peer ? median(theirs) : null };
}

/** EPANET network with the same pipes and the same flows as an analysed tree (node demand = inflow − outflows). */
function peerOf(a: Analysis): PeerNetwork {
  const rhoG = a.water.densityKgM3 * G;
  const out = new Map<string, number>();
  for (const s of a.si.segments) out.set(s.from, (out.get(s.from) ?? 0) + s.designFlow);
  const inflow = new Map(a.si.segments.map((s) => [s.to, s.designFlow]));
  return {
    sourceId: a.si.source.nodeId,
    sourceHeadM: a.si.source.elevation + a.si.source.pressureAtDesignFlow / rhoG,
    junctions: a.si.nodes
      .filter((n) => n.id !== a.si.source.nodeId)
      .map((n) => ({ id: n.id, elevationM: n.elevation, demandM3s: (inflow.get(n.id) ?? 0) - (out.get(n.id) ?? 0) })),
    pipes: a.si.segments.map((s) => ({
      id: s.id,
      from: s.from,
      to: s.to,
      lengthM: s.length,
      diameterM: s.innerDiameter,
      // timing only (the flows are fixed): 1.5e-6 m is the catalog's drawn-tubing roughness (src/engine/catalog/materials.ts,
      // Idelchik 4th ed.); C = 130 is unused with D-W (kept from the earlier bench script)
      roughnessM: 1.5e-6,
      hazenWilliamsC: 130,
      minorK: s.totalK,
    })),
    headloss: 'D-W',
    kinematicViscosityM2s: a.water.kinematicViscosityM2s,
    ourHazenWilliams: hazenWilliamsHeadLoss,
  };
}

function epanetPeer(doc: () => unknown, pipes: number): EngineCase['peer'] {
  let peer: EpanetPeer | undefined;
  return {
    name: `EPANET solveH, same ${pipes.toLocaleString('en-US')}-pipe tree`,
    setup: async () => {
      peer = await EpanetPeer.open(peerOf(analyzeSystem(doc())));
    },
    run: () => peer!.solve(),
    teardown: () => peer?.close(),
  };
}

/** analyzeSystem, then every per-element result read (built on first read): the whole analysis as data. */
function analyzeAndReadAll(doc: unknown): number {
  const a = analyzeSystem(doc);
  return a.segments.length + a.nodes.length + a.fixtures.length + a.si.segments.length + a.si.nodes.length + a.si.fixtures.length;
}

/** The stages up to the checks, without the report (result objects in SI and display units). */
function computeOnly(parsed: SystemDocument): void {
  const model = buildModel(parsed);
  const topo = buildTopology(model);
  borrowPipes(model, topo.order, topo.parentSeg);
  const elev = resolveElevations(model, topo);
  const warnings: EngineWarning[] = [];
  const demand = computeDemand(model, topo, warnings);
  runChecks(model, computeHydraulics(model, topo, demand, elev, warnings), warnings);
}

function engineCases(): EngineCase[] {
  const building = generateBuilding({ storeys: 40 });
  const buildingParsed = SystemDocumentSchema.parse(building);
  // seed 2024 and these options: the random tree the EPANET cross-check in tests/engine uses (tests/engine/support/snapshot.ts)
  const randomTree = generateRandomTree(mulberry32(2024), { segments: 5000, fittingTypes: ['elbow-90-standard', 'tee-run'], frictionMethod: 'swamee-jain' });
  const randomParsed = SystemDocumentSchema.parse(randomTree);
  const demo = JSON.parse(readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8'));
  const n = building.segments.length.toLocaleString('en-US');
  // the aims of issue #16: the whole analysis no slower than EPANET's solve of the same tree, the
  // computation alone at most a fifth of it (a tree is one pass up and one pass down)
  const aim = 'ratio ≤ 1.0';
  const computeAim = 'ratio ≤ 0.20';
  return [
    {
      figure: `engine: 40-storey building, ${n} segments, analyzeSystem (with schema)`,
      run: () => analyzeSystem(building),
      peer: epanetPeer(() => building, building.segments.length),
      aim,
    },
    {
      figure: `engine: 40-storey building, ${n} segments, analyzeSystem and every result object read`,
      run: () => analyzeAndReadAll(building),
      peer: epanetPeer(() => building, building.segments.length),
    },
    {
      figure: `engine: 40-storey building, ${n} segments, analyzeValidated`,
      run: () => analyzeValidated(buildingParsed),
      peer: epanetPeer(() => building, building.segments.length),
      aim,
    },
    {
      figure: `engine: 40-storey building, ${n} segments, computation only (no result objects)`,
      run: () => computeOnly(buildingParsed),
      peer: epanetPeer(() => building, building.segments.length),
      aim: computeAim,
    },
    {
      figure: 'engine: random tree, 5,000 segments (EPANET-checked), analyzeSystem (with schema)',
      run: () => analyzeSystem(randomTree),
      peer: epanetPeer(() => randomTree, randomTree.segments.length),
      aim,
    },
    {
      figure: 'engine: random tree, 5,000 segments (EPANET-checked), analyzeValidated',
      run: () => analyzeValidated(randomParsed),
      peer: epanetPeer(() => randomTree, randomTree.segments.length),
      aim,
    },
    { figure: `engine: demo building (${demo.segments.length} segments), analyzeSystem`, run: () => analyzeSystem(demo), repeatsFactor: 5 },
  ];
}

/** `repeats` timed runs of each case and of its peer (40 by default, a choice: a stable median in a few seconds). */
export async function engineRows(repeats: number, log: (m: string) => void): Promise<BenchRow[]> {
  // epanet-js warns on every solve of a tree whose far nodes fall below zero gauge pressure
  // (the generated buildings are sized for timing, not for a passing verdict): counted, said once
  const warnings = new Map<string, number>();
  const warn = console.warn;
  console.warn = (...args: unknown[]) => {
    const text = args.map(String).join(' ');
    if (!text.startsWith('epanet-js (Warning')) return warn(...args);
    warnings.set(text, (warnings.get(text) ?? 0) + 1);
  };
  try {
    return await timeCases(repeats);
  } finally {
    console.warn = warn;
    for (const [text, n] of warnings) log(`${text} (${n} times, counted rather than printed while timing)`);
  }
}

async function timeCases(repeats: number): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  for (const c of engineCases()) {
    const n = repeats * (c.repeatsFactor ?? 1);
    await c.peer?.setup();
    try {
      const t = timePair(c.run, c.peer?.run ?? null, n);
      rows.push({
        figure: c.figure,
        unit: 'ms',
        median: t.ours,
        runs: n,
        peer: c.peer && t.peer !== null ? { name: c.peer.name, median: t.peer } : undefined,
        aim: c.aim,
      });
    } finally {
      c.peer?.teardown();
    }
  }
  return rows;
}
