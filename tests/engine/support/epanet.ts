/**
 * The same network, solved by EPANET (OWA-EPANET 2.x via epanet-js): shared by the
 * cross-check tests and the benchmark.
 *
 * Mapping (SI, EPANET flow units LPS, so lengths m, diameters mm, heads m):
 * - the source node is a reservoir at head z + p/(ρ·g) with our ρ(T) and g = 9.80665;
 * - every other node is a junction at its elevation with its fixed demand (L/s);
 * - every segment is a pipe with our inside diameter, roughness (mm, D-W) or C (H-W), and as
 *   minor-loss coefficient our segment's total K (referred to its own velocity, like EPANET's);
 * - VISCOSITY is our ν(T) relative to EPANET's reference 1.1e-5 ft²/s (EPANET src/types.h VISCOS).
 *
 * Constants EPANET writes differently, cancelled so that the comparison tests the network
 * solution and not the constants (each is a published choice, not an error on either side):
 * - D-W resistance uses g = 32.2 ft/s² (EPANET src/hydcoeffs.c, resistcoeff: L/2/32.2/d/A²);
 *   we pass length·32.2/g_ft with g_ft = 9.80665/0.3048 = 32.174 ft/s².
 * - minor losses use 0.02517·K/d⁴ (EPANET src/input*.c, ≈ 8/(π²·32.2)); we pass K·(8/(π²·g_ft))/0.02517.
 * - H-W uses 4.727·L/(C^1.852·d^4.871) in ft and cfs (hydcoeffs.c); our hazenWilliamsHeadLoss
 *   uses 10.67/D^4.8704 in SI; we pass each pipe's length times the ratio of the two at that pipe.
 * EPANET converts L/s with 28.317 L/ft³ (exact 28.3168466): a 5e-6 relative difference, left as is.
 */
import { Workspace, Project, NodeProperty, CountType } from 'epanet-js';

const G_SI = 9.80665; // m/s², CGPM 1901
const M_PER_FT = 0.3048; // exact
const G_FT = G_SI / M_PER_FT;
/** EPANET src/types.h: VISCOS 1.1E-5 ft²/s, water at 20 °C. */
const EPANET_VISCOS_M2S = 1.1e-5 * M_PER_FT * M_PER_FT;
/** EPANET's g in D-W resistance (hydcoeffs.c) and its minor-loss constant 0.02517 (input3.c). */
const EPANET_G_FT = 32.2;
const EPANET_MINOR = 0.02517;
/** EPANET src/types.h: LPSperCFS 28.317; MperFT 0.3048. */
const EPANET_LPS_PER_CFS = 28.317;

export interface PeerPipe {
  id: string;
  from: string;
  to: string;
  lengthM: number;
  diameterM: number;
  roughnessM: number;
  hazenWilliamsC: number;
  minorK: number;
}

export interface PeerNetwork {
  sourceId: string;
  sourceHeadM: number;
  junctions: { id: string; elevationM: number; demandM3s: number }[];
  pipes: PeerPipe[];
  headloss: 'D-W' | 'H-W';
  kinematicViscosityM2s: number;
  /** H-W only: our head loss formula, to cancel its constants against EPANET's. */
  ourHazenWilliams?: (flowM3s: number, diameterM: number, lengthM: number, C: number) => number;
  /** Whether to cancel the constants (true for the test; false reports the raw difference). */
  cancelConstants?: boolean;
}

/** EPANET's H-W head loss in SI terms, from its US-unit formula (hydcoeffs.c). */
function epanetHazenWilliams(flowM3s: number, diameterM: number, lengthM: number, C: number): number {
  const qCfs = (flowM3s * 1000) / EPANET_LPS_PER_CFS;
  const hFt = (4.727 * (lengthM / M_PER_FT) * qCfs ** 1.852) / (C ** 1.852 * (diameterM / M_PER_FT) ** 4.871);
  return hFt * M_PER_FT;
}

export function toInp(net: PeerNetwork): string {
  const cancel = net.cancelConstants !== false;
  const lines: string[] = ['[TITLE]', 'Headroom cross-check', '', '[JUNCTIONS]'];
  for (const j of net.junctions) lines.push(`${j.id} ${j.elevationM.toPrecision(17)} ${(j.demandM3s * 1000).toPrecision(17)}`);
  lines.push('', '[RESERVOIRS]', `${net.sourceId} ${net.sourceHeadM.toPrecision(17)}`, '', '[PIPES]');
  const minorFactor = cancel ? 8 / (Math.PI * Math.PI * G_FT) / EPANET_MINOR : 1;
  for (const p of net.pipes) {
    let length = p.lengthM;
    let rough: number;
    if (net.headloss === 'D-W') {
      if (cancel) length *= EPANET_G_FT / G_FT;
      rough = p.roughnessM * 1000;
    } else {
      if (cancel) {
        if (!net.ourHazenWilliams) throw new Error('toInp: H-W needs ourHazenWilliams to cancel constants');
        // Both formulas are ∝ Q^1.852, so the ratio does not depend on the flow used here.
        const qRef = 0.001;
        length *= net.ourHazenWilliams(qRef, p.diameterM, p.lengthM, p.hazenWilliamsC) / epanetHazenWilliams(qRef, p.diameterM, p.lengthM, p.hazenWilliamsC);
      }
      rough = p.hazenWilliamsC;
    }
    lines.push(
      `${p.id} ${p.from} ${p.to} ${length.toPrecision(17)} ${(p.diameterM * 1000).toPrecision(17)} ${rough.toPrecision(17)} ${(p.minorK * minorFactor).toPrecision(17)} Open`,
    );
  }
  lines.push(
    '',
    '[OPTIONS]',
    'Units LPS',
    `Headloss ${net.headloss}`,
    `Viscosity ${(net.kinematicViscosityM2s / EPANET_VISCOS_M2S).toPrecision(17)}`,
    'Specific Gravity 1.0',
    'Trials 200',
    'Accuracy 0.0000001',
    'Demand Multiplier 1.0',
    '',
    '[TIMES]',
    'Duration 0',
    '',
    '[END]',
  );
  return lines.join('\n');
}

export interface PeerSolution {
  headM: Map<string, number>;
}

/** A loaded EPANET project with the network open; `solve()` runs the hydraulic solution only. */
export class EpanetPeer {
  private constructor(
    private readonly project: Project,
    private readonly nodeIds: string[],
  ) {}

  static async open(net: PeerNetwork): Promise<EpanetPeer> {
    const ws = new Workspace();
    await ws.loadModule();
    const project = new Project(ws);
    ws.writeFile('net.inp', toInp(net));
    project.open('net.inp', 'net.rpt', '');
    const n = project.getCount(CountType.NodeCount);
    const ids: string[] = [];
    for (let i = 1; i <= n; i++) ids.push(project.getNodeId(i));
    return new EpanetPeer(project, ids);
  }

  /** EN_solveH: the steady hydraulic solution (what the benchmark times). */
  solve(): void {
    this.project.solveH();
  }

  heads(): Map<string, number> {
    const heads = new Map<string, number>();
    const values = this.project.getNodeValues(NodeProperty.Head);
    for (let i = 0; i < this.nodeIds.length; i++) heads.set(this.nodeIds[i], values[i]);
    return heads;
  }

  close(): void {
    this.project.close();
  }
}
