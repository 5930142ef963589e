/**
 * The registry of friction methods: what the user can pick, with each method's equation,
 * validity and source, and one published reference case that the tests evaluate.
 */
export type FrictionMethod = 'colebrook' | 'swamee-jain' | 'churchill-1977' | 'hazen-williams';

export interface FrictionReferenceCase {
  /** Arguments of the method's function, in its parameter order. */
  args: readonly number[];
  expected: number;
  source: string;
}

export interface FrictionMethodEntry {
  id: FrictionMethod;
  label: string;
  equation: string;
  validity: string;
  source: string;
  /** Name of the exported function that implements it. */
  functionName: 'colebrook' | 'swameeJain1976' | 'churchill1977' | 'hazenWilliamsPressureLoss';
  referenceCase: FrictionReferenceCase;
}

export const FRICTION_METHODS: Record<FrictionMethod, FrictionMethodEntry> = {
  colebrook: {
    id: 'colebrook',
    label: 'Darcy–Weisbach, Colebrook equation (solved)',
    equation: '1/√f = −2·log10((ε/D)/3.7 + 2.51/(Re·√f))',
    validity: 'turbulent flow, 4e3 ≤ Re ≤ 1e8, ε/D ≤ 0.05; laminar and transitional handled separately',
    source: 'C. F. Colebrook, J. Inst. Civil Eng. 11(4), 133–156 (1939)',
    functionName: 'colebrook',
    referenceCase: {
      args: [1e5, 1e-4],
      expected: 0.018513866077471648,
      source: 'Colebrook (1939) solved at Re = 1e5, ε/D = 1e-4, as computed by an independent open-source implementation (fluids 1.3.1)',
    },
  },
  'swamee-jain': {
    id: 'swamee-jain',
    label: 'Darcy–Weisbach, Swamee–Jain explicit form',
    equation: 'f = 0.25/[log10((ε/D)/3.7 + 5.74/Re^0.9)]²',
    validity: '5e3 ≤ Re ≤ 1e8, 1e-6 ≤ ε/D ≤ 0.05',
    source: 'P. K. Swamee and A. K. Jain, J. Hydraulics Div. ASCE 102(5), 657–664 (1976)',
    functionName: 'swameeJain1976',
    referenceCase: {
      args: [1e5, 1e-4],
      expected: 0.018452424431901808,
      source: 'Swamee & Jain (1976) at Re = 1e5, ε/D = 1e-4, as computed by an independent open-source implementation (fluids 1.3.1)',
    },
  },
  'churchill-1977': {
    id: 'churchill-1977',
    label: 'Darcy–Weisbach, Churchill all-regime form',
    equation: 'f = 8·[(8/Re)^12 + (A+B)^−1.5]^(1/12), A = [2.457·ln(1/((7/Re)^0.9 + 0.27ε/D))]^16, B = (37530/Re)^16',
    validity: 'all Re (laminar, transitional, turbulent), ε/D ≤ 0.05',
    source: 'S. W. Churchill, Chemical Engineering 84(24), 91–92 (1977)',
    functionName: 'churchill1977',
    referenceCase: {
      args: [1e5, 1e-4],
      expected: 0.018462624566280075,
      source: 'Churchill (1977) at Re = 1e5, ε/D = 1e-4, as computed by an independent open-source implementation (fluids 1.3.1)',
    },
  },
  'hazen-williams': {
    id: 'hazen-williams',
    label: 'Hazen–Williams, pressure form (psi per foot, independent of temperature)',
    equation: 'p = 4.52·Q^1.852/(C^1.852·d^4.8704) psi/ft (Q gpm, d in); SI: p = 1.0448e5·Q^1.852/(C^1.852·D^4.8704) Pa/m (Q m³/s, D m)',
    validity:
      'water in full turbulent flow at building-piping velocities; no viscosity or density term: the same pressure loss is used for hot and cold water, as the codes print it',
    source:
      'Williams & Hazen, Hydraulic Tables, 2nd ed. (1909); US pressure form as printed in NFPA 13 hydraulic calculations (4.52·Q^1.852/(C^1.852·d^4.87) psi/ft); SI constant is its exact unit conversion',
    functionName: 'hazenWilliamsPressureLoss',
    referenceCase: {
      // 100 gpm in 2.067 in ID (Sch 40 2 in), 1 ft of pipe, C = 120, against the independently printed
      // SI head form h = 10.67·L·Q^1.852/(C^1.852·D^4.8704) m taken as a conventional metre of water
      // (9806.65 Pa): 10.67·0.3048·Q^1.852/(120^1.852·0.0525018^4.8704) m = 0.0661195 m → 648.4095 Pa.
      // The two printed constants agree to 0.15 %.
      args: [100 * (3.785411784e-3 / 60), 2.067 * 0.0254, 0.3048, 120],
      expected: 648.4095,
      source:
        'SI head form h_f = 10.67·L·Q^1.852/(C^1.852·D^4.8704) (piping-designer.com "Hazen-Williams equation"), 1 m of water = 9806.65 Pa: a cross-check of the two printed constants',
    },
  },
};
