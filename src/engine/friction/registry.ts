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
  functionName: 'colebrook' | 'swameeJain1976' | 'churchill1977' | 'hazenWilliamsHeadLoss';
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
      source: 'CalebBell/fluids 1.3.1 tests/test_friction.py, Colebrook(1e5, 1e-4)',
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
      source: 'CalebBell/fluids 1.3.1 tests/test_friction.py, Swamee_Jain_1976(1e5, 1e-4)',
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
      source: 'CalebBell/fluids 1.3.1 tests/test_friction.py, Churchill_1977(1e5, 1e-4)',
    },
  },
  'hazen-williams': {
    id: 'hazen-williams',
    label: 'Hazen–Williams',
    equation: 'h_f = 10.67·L·Q^1.852/(C^1.852·D^4.8704)  (SI: m, m³/s)',
    validity: 'water at ordinary temperatures (about 4–25 °C), turbulent flow; ignores viscosity',
    source: 'Williams & Hazen, Hydraulic Tables, 2nd ed. (1909); NFPA 13 US form 4.52·Q^1.852/(C^1.852·d^4.87) psi/ft',
    functionName: 'hazenWilliamsHeadLoss',
    referenceCase: {
      // 100 gpm in 2.067 in ID (Sch 40 2 in), 1 ft of pipe, C = 120. The US pressure form gives
      // 4.52·100^1.852/(120^1.852·2.067^4.8704) = 0.0938989 psi/ft; over 1 ft that is 0.0938989 psi
      // = 647.41 Pa, which is 0.0660824 m of water at 60 °F (ρ = 999.017 kg/m³, IAPWS-95; g = 9.80665).
      args: [100 * (3.785411784e-3 / 60), 2.067 * 0.0254, 0.3048, 120],
      expected: 0.0660824144962665,
      source:
        'NFPA 13 US pressure form p = 4.52·Q^1.852/(C^1.852·d^4.8704) psi/ft (converted; a consistency check of the two published constants, which agree to about 0.1 %)',
    },
  },
};
