/**
 * Benchmarks (`npm run bench`): a list of cases, each printing its median time over repeated
 * runs, the median of its peer (when it has one) and the ratio. The lead adds API, PDF and
 * client rows to CASES; each case is { name, run, peer? } with optional async setup.
 *
 * Engine rows: the generated 40-storey, 5,000-segment building and the demo building, through
 * analyzeSystem (schema validation included) and through analyzeValidated (a document already
 * validated, as the live client re-runs it); the peer is EPANET (epanet-js) solving the same
 * 5,000-pipe tree — EN_solveH only, the network opened beforehand (solve, not build).
 * One row times the computation alone (SI model, topology, demand, hydraulics, checks) without
 * building the result objects, to show where the time goes.
 */
import { readFileSync } from 'node:fs';
import { analyzeSystem, SystemDocumentSchema, type Analysis } from '../src/engine';
import { analyzeValidated } from '../src/engine/analysis/analyze';
import { buildModel } from '../src/engine/analysis/input';
import { buildTopology } from '../src/engine/analysis/topology';
import { computeDemand } from '../src/engine/analysis/demand';
import { computeHydraulics } from '../src/engine/analysis/hydraulics';
import { runChecks } from '../src/engine/analysis/checks';
import type { EngineWarning } from '../src/engine/warnings';
import type { SystemDocument } from '../src/engine/model/schema';
import { hazenWilliamsHeadLoss } from '../src/engine/friction';
import { G } from '../src/engine/units';
import { generateBuilding, generateRandomTree, mulberry32 } from '../src/engine/testing/generateTree';
import { EpanetPeer, type PeerNetwork } from '../tests/engine/support/epanet';
import { benchSummaryPdf } from '../server/pdf/bench';

export interface BenchCase {
  name: string;
  /** Prepares what `run` needs (not timed). */
  setup?: () => Promise<void> | void;
  run: () => void;
  peer?: { name: string; setup?: () => Promise<void> | void; run: () => void; teardown?: () => void };
  repeats?: number;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function time(run: () => void, repeats: number): number {
  for (let i = 0; i < Math.min(5, repeats); i++) run(); // warm-up (JIT), not counted
  const ts: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    run();
    ts.push(performance.now() - t0);
  }
  return median(ts);
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
      roughnessM: 1.5e-6,
      hazenWilliamsC: 130,
      minorK: s.totalK,
    })),
    headloss: 'D-W',
    kinematicViscosityM2s: a.water.kinematicViscosityM2s,
    ourHazenWilliams: hazenWilliamsHeadLoss,
  };
}

function epanetPeer(doc: () => unknown) {
  let peer: EpanetPeer | undefined;
  return {
    name: 'EPANET solveH, same 5,000-pipe tree',
    setup: async () => {
      peer = await EpanetPeer.open(peerOf(analyzeSystem(doc())));
    },
    run: () => peer!.solve(),
    teardown: () => peer?.close(),
  };
}

/** The stages up to the checks, without the report (result objects in SI and display units). */
function computeOnly(parsed: SystemDocument): void {
  const model = buildModel(parsed);
  const topo = buildTopology(model);
  const warnings: EngineWarning[] = [];
  const demand = computeDemand(model, topo, warnings);
  runChecks(model, computeHydraulics(model, topo, demand, warnings), warnings);
}

const building = generateBuilding({ storeys: 40 });
const buildingParsed = SystemDocumentSchema.parse(building);
const randomTree = generateRandomTree(mulberry32(2024), { segments: 5000, fittingTypes: ['elbow-90-standard', 'tee-run'], frictionMethod: 'swamee-jain' });
const randomParsed = SystemDocumentSchema.parse(randomTree);
const demo = JSON.parse(readFileSync(new URL('../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8'));

export const CASES: BenchCase[] = [
  { name: `engine: 40-storey building, ${building.segments.length} segments, analyzeSystem (with schema)`, run: () => analyzeSystem(building), peer: epanetPeer(() => building) },
  { name: `engine: 40-storey building, ${building.segments.length} segments, analyzeValidated`, run: () => analyzeValidated(buildingParsed), peer: epanetPeer(() => building) },
  { name: `engine: 40-storey building, ${building.segments.length} segments, computation only (no result objects)`, run: () => computeOnly(buildingParsed), peer: epanetPeer(() => building) },
  { name: 'engine: random tree, 5,000 segments (EPANET-checked), analyzeSystem (with schema)', run: () => analyzeSystem(randomTree), peer: epanetPeer(() => randomTree) },
  { name: 'engine: random tree, 5,000 segments (EPANET-checked), analyzeValidated', run: () => analyzeValidated(randomParsed), peer: epanetPeer(() => randomTree) },
  { name: `engine: demo building alder-finch-cold (${demo.segments.length} segments), analyzeSystem`, run: () => analyzeSystem(demo), repeats: 200 },
];

async function main() {
  const rows: string[][] = [['case', 'median ms', 'peer median ms', 'ratio']];
  for (const c of CASES) {
    await c.setup?.();
    const repeats = c.repeats ?? 40;
    const ms = time(c.run, repeats);
    let peerMs: number | null = null;
    if (c.peer) {
      await c.peer.setup?.();
      peerMs = time(c.peer.run, repeats);
      c.peer.teardown?.();
    }
    rows.push([c.name, ms.toFixed(2), peerMs === null ? '—' : peerMs.toFixed(2), peerMs === null ? '—' : (ms / peerMs).toFixed(2)]);
  }
  // PDF: the issued summary against a one-page pdf-lib document with the same two fonts (the floor)
  const pdf = await benchSummaryPdf(9);
  const floor = pdf.find((r) => r.segments === 0)!;
  for (const r of pdf.filter((x) => x.segments > 0)) {
    rows.push([`pdf: ${r.name}, ${r.segments} segments, ${r.pages} pages`, r.medianMs.toFixed(2), floor.medianMs.toFixed(2), (r.medianMs / floor.medianMs).toFixed(2)]);
  }
  const w = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  for (const r of rows) console.log(r.map((cell, i) => (i === 0 ? cell.padEnd(w[i]) : cell.padStart(w[i]))).join('  '));
  console.log('Aims: 5,000 segments under 10 ms and at most 1/5 of EPANET\'s solve time (ratio ≤ 0.20); the 200-segment PDF under 300 ms.');
}

await main();
