/**
 * Pipe and tube materials: inside diameters by nominal size, absolute roughness and Hazen–Williams C,
 * each with its source. Dimensions are tabulated in inches as the standards give them and converted
 * to metres (exact inch) below.
 */
import { M_PER_IN } from '../units';
import { NOT_VERIFIED } from './notVerified';

export type MaterialId =
  'copper-k' | 'copper-l' | 'copper-m' | 'pex-sdr9' | 'cpvc-sdr11' | 'pvc-sch40' | 'pvc-sch80' | 'steel-sch40' | 'galvanized-steel-sch40';

export interface PipeSize {
  key: string;
  nominalIn: number;
  outerDiameterM: number;
  innerDiameterM: number;
}

export interface Material {
  id: MaterialId;
  label: string;
  roughnessM: number;
  roughnessSource: string;
  hazenWilliamsC: number;
  hazenWilliamsSource: string;
  dimensionSource: string;
  sizes: readonly PipeSize[];
  velocityClass: 'copper' | 'plastic' | 'steel';
  /**
   * false when any of the material's data (named in `unverified`) could not be checked against a
   * printed source: screens and the PDF say "not verified against the printed code — confirm
   * against the adopted edition".
   */
  verified: boolean;
  /** Which data are not verified (empty when verified). */
  unverified: readonly MaterialDatum[];
}

export type MaterialDatum = 'dimensions' | 'roughness' | 'hazenWilliamsC';

const NOMINAL: Record<string, number> = {
  '3/8': 0.375,
  '1/2': 0.5,
  '5/8': 0.625,
  '3/4': 0.75,
  '1': 1,
  '1-1/4': 1.25,
  '1-1/2': 1.5,
  '2': 2,
  '2-1/2': 2.5,
  '3': 3,
  '3-1/2': 3.5,
  '4': 4,
  '5': 5,
  '6': 6,
};

/** Rows [size key, OD in, ID in] → sizes in metres. */
function sizes(rows: readonly (readonly [string, number, number])[]): readonly PipeSize[] {
  return Object.freeze(
    rows.map(([key, od, id]) => Object.freeze({ key, nominalIn: NOMINAL[key], outerDiameterM: od * M_PER_IN, innerDiameterM: id * M_PER_IN })),
  );
}

// ASTM B88 copper water tube, OD = nominal + 1/8 in. Field-PM copper tube size chart, cross-checked
// with CDA Copper Tube Handbook Table 14.2f (K and L); 3-1/2 in from CDA 14.2f; 3/8 in from sizes.com.
const B88_SOURCE = 'ASTM B88, as tabulated in the CDA Copper Tube Handbook Table 14.2f and the Field-PM copper tube size chart';
const COPPER_K = sizes([
  ['3/8', 0.5, 0.402],
  ['1/2', 0.625, 0.527],
  ['3/4', 0.875, 0.745],
  ['1', 1.125, 0.995],
  ['1-1/4', 1.375, 1.245],
  ['1-1/2', 1.625, 1.481],
  ['2', 2.125, 1.959],
  ['2-1/2', 2.625, 2.435],
  ['3', 3.125, 2.907],
  ['3-1/2', 3.625, 3.385],
  ['4', 4.125, 3.857],
]);
const COPPER_L = sizes([
  ['3/8', 0.5, 0.43],
  ['1/2', 0.625, 0.545],
  ['3/4', 0.875, 0.785],
  ['1', 1.125, 1.025],
  ['1-1/4', 1.375, 1.265],
  ['1-1/2', 1.625, 1.505],
  ['2', 2.125, 1.985],
  ['2-1/2', 2.625, 2.465],
  ['3', 3.125, 2.945],
  ['3-1/2', 3.625, 3.425],
  ['4', 4.125, 3.905],
]);
const COPPER_M = sizes([
  ['3/8', 0.5, 0.45],
  ['1/2', 0.625, 0.569],
  ['3/4', 0.875, 0.811],
  ['1', 1.125, 1.055],
  ['1-1/4', 1.375, 1.291],
  ['1-1/2', 1.625, 1.527],
  ['2', 2.125, 2.009],
  ['2-1/2', 2.625, 2.495],
  ['3', 3.125, 2.981],
  ['4', 4.125, 3.935],
]);
// PEX SDR 9, copper tube size (ASTM F876): 3/8–1 in from a supplier sheet citing ASTM SDR-9;
// 1-1/4–2 in computed from wall = OD/9 (F876 SDR 9 definition), see REFERENCES §5b.
const PEX = sizes([
  ['3/8', 0.5, 0.36],
  ['1/2', 0.625, 0.485],
  ['5/8', 0.75, 0.584],
  ['3/4', 0.875, 0.681],
  ['1', 1.125, 0.875],
  ['1-1/4', 1.375, 1.069],
  ['1-1/2', 1.625, 1.263],
  ['2', 2.125, 1.653],
]);
// CPVC SDR 11, copper tube size (ASTM D2846): wall = OD/11 with 0.068 in minimum; the D2846 table was
// not seen. The metric IS 15778 SDR 11 walls (a manufacturer's table) agree within 0.002 in, which is a
// plausibility check only: flagged unverified.
const CPVC = sizes([
  ['1/2', 0.625, 0.489],
  ['3/4', 0.875, 0.715],
  ['1', 1.125, 0.921],
  ['1-1/4', 1.375, 1.125],
  ['1-1/2', 1.625, 1.329],
  ['2', 2.125, 1.739],
]);
// Schedule 40 (ASTM D1785 PVC; ASME B36.10M steel share the inch dimensions), the inch values of the
// standards as tabulated in a published pipe sizing chart (civiljungles; 5 and 6 in from the same chart);
// Schedule 80 inch values also match a pipe supplier's listing.
const SCH40 = sizes([
  ['1/2', 0.84, 0.622],
  ['3/4', 1.05, 0.824],
  ['1', 1.315, 1.049],
  ['1-1/4', 1.66, 1.38],
  ['1-1/2', 1.9, 1.61],
  ['2', 2.375, 2.067],
  ['2-1/2', 2.875, 2.469],
  ['3', 3.5, 3.068],
  ['3-1/2', 4.0, 3.548],
  ['4', 4.5, 4.026],
]);
const SCH40_STEEL = sizes([
  ['1/2', 0.84, 0.622],
  ['3/4', 1.05, 0.824],
  ['1', 1.315, 1.049],
  ['1-1/4', 1.66, 1.38],
  ['1-1/2', 1.9, 1.61],
  ['2', 2.375, 2.067],
  ['2-1/2', 2.875, 2.469],
  ['3', 3.5, 3.068],
  ['3-1/2', 4.0, 3.548],
  ['4', 4.5, 4.026],
  ['5', 5.563, 5.047],
  ['6', 6.625, 6.065],
]);
const SCH80 = sizes([
  ['1/2', 0.84, 0.546],
  ['3/4', 1.05, 0.742],
  ['1', 1.315, 0.957],
  ['1-1/4', 1.66, 1.278],
  ['1-1/2', 1.9, 1.5],
  ['2', 2.375, 1.939],
  ['2-1/2', 2.875, 2.323],
  ['3', 3.5, 2.9],
  ['3-1/2', 4.0, 3.364],
  ['4', 4.5, 3.826],
]);

const DRAWN_ROUGHNESS = 1.5e-6;
const DRAWN_SOURCE =
  'drawn tubing 1.5e-6 m (0.000005 ft): lower end of the range for "commercially smooth" seamless copper and brass tubes, 1.5e-6–1.0e-5 m, I. E. Idelchik, Handbook of Hydraulic Resistance, 4th ed.';
const PLASTIC_ROUGHNESS_SOURCE = `plastic pipe 1.5e-6 m: common practice, ${NOT_VERIFIED}; Farshad & Rieke (2006) give 5e-6 m average for plastic-coated pipe`;
const STEEL_ROUGHNESS_SOURCE = 'clean commercial steel 0.0018 in (4.57e-5 m): Crane Technical Paper No. 410 (2009)';
const GALV_ROUGHNESS_SOURCE = `galvanized iron 0.0005 ft = 1.52e-4 m, the usual friction-chart value, ${NOT_VERIFIED}; Idelchik, Handbook of Hydraulic Resistance, 4th ed., gives 1.0e-4–1.5e-4 m for ordinary galvanized steel tube`;
const HW_COPPER = 'C = 130: lower end of copper 130–140, Engineering ToolBox "Hazen-Williams coefficients" (conservative for a pressure check)';
const HW_PVC = 'C = 150: PVC/CPVC, Engineering ToolBox "Hazen-Williams coefficients"';
const HW_PEX = `C = 150: PEX, common practice (no code table found), ${NOT_VERIFIED}`;
const HW_STEEL =
  'C = 120: galvanized iron 120, Engineering ToolBox "Hazen-Williams coefficients"; below new unlined steel\'s 140–150 on the same table, allowing for pipe in service';

const ENTRIES: Record<MaterialId, Material> = {
  'copper-k': {
    id: 'copper-k',
    label: 'Copper tube, Type K',
    roughnessM: DRAWN_ROUGHNESS,
    roughnessSource: DRAWN_SOURCE,
    hazenWilliamsC: 130,
    hazenWilliamsSource: HW_COPPER,
    dimensionSource: B88_SOURCE,
    sizes: COPPER_K,
    velocityClass: 'copper',
    verified: true,
    unverified: [],
  },
  'copper-l': {
    id: 'copper-l',
    label: 'Copper tube, Type L',
    roughnessM: DRAWN_ROUGHNESS,
    roughnessSource: DRAWN_SOURCE,
    hazenWilliamsC: 130,
    hazenWilliamsSource: HW_COPPER,
    dimensionSource: B88_SOURCE,
    sizes: COPPER_L,
    velocityClass: 'copper',
    verified: true,
    unverified: [],
  },
  'copper-m': {
    id: 'copper-m',
    label: 'Copper tube, Type M',
    roughnessM: DRAWN_ROUGHNESS,
    roughnessSource: DRAWN_SOURCE,
    hazenWilliamsC: 130,
    hazenWilliamsSource: HW_COPPER,
    dimensionSource: B88_SOURCE,
    sizes: COPPER_M,
    velocityClass: 'copper',
    verified: true,
    unverified: [],
  },
  'pex-sdr9': {
    id: 'pex-sdr9',
    label: 'PEX tubing, SDR 9 (copper tube size)',
    roughnessM: 1.5e-6,
    roughnessSource: PLASTIC_ROUGHNESS_SOURCE,
    hazenWilliamsC: 150,
    hazenWilliamsSource: HW_PEX,
    dimensionSource: `ASTM F876 SDR 9: 3/8–1 in from a supplier dimension sheet citing ASTM SDR 9; 1-1/4–2 in computed as wall = OD/9 (the SDR 9 definition), ${NOT_VERIFIED}`,
    sizes: PEX,
    velocityClass: 'plastic',
    verified: false,
    unverified: ['dimensions', 'roughness', 'hazenWilliamsC'],
  },
  'cpvc-sdr11': {
    id: 'cpvc-sdr11',
    label: 'CPVC, SDR 11 (copper tube size)',
    roughnessM: 1.5e-6,
    roughnessSource: PLASTIC_ROUGHNESS_SOURCE,
    hazenWilliamsC: 150,
    hazenWilliamsSource: HW_PVC,
    dimensionSource: `ASTM D2846 SDR 11, wall = OD/11 with a 0.068 in minimum, ${NOT_VERIFIED} (walls agree within 0.002 in with the metric IS 15778 SDR 11 table)`,
    sizes: CPVC,
    velocityClass: 'plastic',
    verified: false,
    unverified: ['dimensions', 'roughness'],
  },
  'pvc-sch40': {
    id: 'pvc-sch40',
    label: 'PVC, Schedule 40',
    roughnessM: 1.5e-6,
    roughnessSource: PLASTIC_ROUGHNESS_SOURCE,
    hazenWilliamsC: 150,
    hazenWilliamsSource: HW_PVC,
    dimensionSource: 'ASTM D1785 Schedule 40 (the inch dimensions of ASME B36.10M Schedule 40), as tabulated in a published pipe sizing chart (civiljungles)',
    sizes: SCH40,
    velocityClass: 'plastic',
    verified: false,
    unverified: ['roughness'],
  },
  'pvc-sch80': {
    id: 'pvc-sch80',
    label: 'PVC, Schedule 80',
    roughnessM: 1.5e-6,
    roughnessSource: PLASTIC_ROUGHNESS_SOURCE,
    hazenWilliamsC: 150,
    hazenWilliamsSource: HW_PVC,
    dimensionSource: 'ASTM D1785 Schedule 80, inch dimensions as listed by a PVC pipe supplier (sgwshop)',
    sizes: SCH80,
    velocityClass: 'plastic',
    verified: false,
    unverified: ['roughness'],
  },
  'steel-sch40': {
    id: 'steel-sch40',
    label: 'Steel pipe, Schedule 40',
    roughnessM: 0.0018 * M_PER_IN,
    roughnessSource: STEEL_ROUGHNESS_SOURCE,
    hazenWilliamsC: 120,
    hazenWilliamsSource: HW_STEEL,
    dimensionSource: 'ASME B36.10M Schedule 40, inch dimensions as tabulated in a published pipe sizing chart (civiljungles)',
    sizes: SCH40_STEEL,
    velocityClass: 'steel',
    verified: true,
    unverified: [],
  },
  'galvanized-steel-sch40': {
    id: 'galvanized-steel-sch40',
    label: 'Galvanized steel pipe, Schedule 40',
    roughnessM: 1.52e-4,
    roughnessSource: GALV_ROUGHNESS_SOURCE,
    hazenWilliamsC: 120,
    hazenWilliamsSource: HW_STEEL,
    dimensionSource: 'ASME B36.10M Schedule 40 (as steel-sch40)',
    sizes: SCH40_STEEL,
    velocityClass: 'steel',
    verified: false,
    unverified: ['roughness'],
  },
};

for (const entry of Object.values(ENTRIES)) {
  Object.freeze(entry.unverified);
  Object.freeze(entry);
}

export const MATERIALS: Readonly<Record<MaterialId, Material>> = Object.freeze(ENTRIES);

export function pipeSize(material: MaterialId, sizeKey: string): PipeSize | undefined {
  const m = Object.prototype.hasOwnProperty.call(MATERIALS, material) ? MATERIALS[material] : undefined;
  return m?.sizes.find((s) => s.key === sizeKey);
}
