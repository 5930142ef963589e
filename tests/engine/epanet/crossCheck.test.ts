/**
 * Cross-check against EPANET (OWA-EPANET 2.x through epanet-js 0.9.0): generated tree networks
 * with fixed demands, turbulent flow (Re ≥ ~5000), random sizes, lengths, rises and K sums,
 * solved by both with the same friction formula — Swamee–Jain for Darcy–Weisbach (EPANET
 * src/hydcoeffs.c frictionFactor uses Swamee–Jain for Re ≥ 4000) and Hazen–Williams — must
 * agree at every node within 0.05 psi (the acceptance limit of the engine's issue).
 * EPANET's own constants (g = 32.2 ft/s², 0.02517 for minor losses, its H-W coefficients) are
 * cancelled as described in tests/engine/support/epanet.ts; the raw difference is printed too.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../../src/engine';
import { hazenWilliamsPressureLoss } from '../../../src/engine/friction';
import { G, PA_PER_PSI } from '../../../src/engine/units';
import { generateRandomTree, mulberry32 } from '../../../src/engine/testing/generateTree';
import { EpanetPeer, type PeerNetwork } from '../support/epanet';
import type { Analysis } from '../../../src/engine';

const TOLERANCE_PSI = 0.05;
const FITTINGS = ['elbow-90-standard', 'tee-run', 'tee-branch', 'valve-ball-full-port', 'valve-check-swing'];

export function peerNetworkOf(a: Analysis, doc: ReturnType<typeof generateRandomTree>, headloss: 'D-W' | 'H-W', cancelConstants = true): PeerNetwork {
  const rhoG = a.water.densityKgM3 * G;
  const src = a.si.source;
  const demand = new Map(doc.nodes.map((n) => [n.id, (n.continuousDemand ?? 0) / 1000]));
  const bySeg = new Map(doc.segments.map((s) => [s.id, s]));
  return {
    sourceId: src.nodeId,
    sourceHeadM: src.elevation + src.pressureAtDesignFlow / rhoG,
    junctions: a.si.nodes.filter((n) => n.id !== src.nodeId).map((n) => ({ id: n.id, elevationM: n.elevation, demandM3s: demand.get(n.id)! })),
    pipes: a.si.segments.map((s) => ({
      id: s.id,
      from: s.from,
      to: s.to,
      lengthM: s.length,
      diameterM: s.innerDiameter,
      roughnessM: bySeg.get(s.id)!.custom!.roughness / 1000,
      hazenWilliamsC: bySeg.get(s.id)!.custom!.hazenWilliamsC,
      minorK: s.totalK,
    })),
    headloss,
    kinematicViscosityM2s: a.water.kinematicViscosityM2s,
    // Our loss is a pressure (the printed form); EPANET works in head: divide by this run's ρ·g.
    ourHazenWilliams: (q, d, l, c) => hazenWilliamsPressureLoss(q, d, l, c) / rhoG,
    cancelConstants,
  };
}

async function compare(segments: number, seed: number, method: 'swamee-jain' | 'hazen-williams', cancel = true) {
  const doc = generateRandomTree(mulberry32(seed), { segments, fittingTypes: FITTINGS, frictionMethod: method });
  const a = analyzeSystem(doc);
  for (const s of a.si.segments) expect(s.reynolds).toBeGreaterThan(4000); // turbulent everywhere
  const peer = await EpanetPeer.open(peerNetworkOf(a, doc, method === 'swamee-jain' ? 'D-W' : 'H-W', cancel));
  peer.solve();
  const heads = peer.heads();
  peer.close();
  const rhoG = a.water.densityKgM3 * G;
  let worst = 0;
  for (const n of a.si.nodes) {
    const pEpanet = (heads.get(n.id)! - n.elevation) * rhoG;
    worst = Math.max(worst, Math.abs(pEpanet - n.pressure) / PA_PER_PSI);
  }
  return worst;
}

describe('EPANET cross-check', () => {
  const cases: [number, number][] = [
    [10, 1],
    [50, 2],
    [200, 3],
    [1000, 4],
    [3000, 5],
  ];
  const worst: Record<string, number> = {};
  for (const method of ['swamee-jain', 'hazen-williams'] as const) {
    for (const [n, seed] of cases) {
      it(`${method}: ${n} segments agree at every node within ${TOLERANCE_PSI} psi`, async () => {
        const d = await compare(n, seed, method);
        worst[`${method} ${n}`] = d;
        expect(d).toBeLessThan(TOLERANCE_PSI);
      });
    }
  }
  it('reports the largest differences (and the raw ones with EPANET constants as they are)', async () => {
    const raw = {
      'swamee-jain 1000 raw': await compare(1000, 4, 'swamee-jain', false),
      'hazen-williams 1000 raw': await compare(1000, 4, 'hazen-williams', false),
    };
    console.log('EPANET largest |Δp| (psi):', JSON.stringify({ ...worst, ...raw }, null, 1));
    expect(Object.keys(worst).length).toBe(cases.length * 2);
  });
});
