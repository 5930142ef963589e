/**
 * Working-pressure rating of each catalog material at the water temperature, from published
 * pressure–temperature tables. The static-pressure check compares the highest static pressure a
 * pipe can see with this rating.
 *
 * Conventions (stated once, repeated in every returned source string where they apply):
 * - Between two tabulated temperatures the rating is interpolated linearly. The published tables give
 *   points only; a straight line between neighbours is the usual reading of such a table.
 * - Below the lowest tabulated temperature the lowest-temperature rating applies (a rating at 73 °F or
 *   100 °F is the base rating; colder water does not lower it — common practice). Above the highest
 *   tabulated temperature there is no rating (null): the material is outside its published range.
 * - Soldered copper: the rating is the lower of the drawn tube's rating and the rating of a lead-free
 *   95-5 tin-antimony soldered joint for its size range; the joint governs at every catalog size.
 *   Brazed joints anneal drawn tube and call for the annealed rating (CDA table note), which this
 *   function does not assume.
 * - null where no published rating is known (PVC and steel: no table was found).
 */
import { celsiusToFahrenheit, PA_PER_PSI } from '../units';
import { NOT_VERIFIED } from './notVerified';

export interface PressureRating {
  ratingPa: number;
  /** The published table (edition, table, row) and the reading made of it at this temperature. */
  source: string;
  /** false where the value could not be checked against a printed table: confirm against the adopted edition. */
  verified: boolean;
}

/** A pressure–temperature table: ascending [°F, psi] points. */
type Curve = readonly (readonly [number, number])[];

interface Reading {
  psi: number;
  /** how the value was read from the table, in words */
  how: string;
  /** the bracketing points used */
  lowF: number;
  highF: number;
}

const fmt = (v: number): string => String(Math.round(v * 10) / 10);

/** Linear interpolation in a pressure–temperature table; null above its highest temperature. */
function readCurve(curve: Curve, tF: number): Reading | null {
  const [firstF, firstPsi] = curve[0];
  if (tF <= firstF) {
    return { psi: firstPsi, how: `${firstPsi} psi, the ${firstF} °F rating (no derating below it)`, lowF: firstF, highF: firstF };
  }
  for (let i = 1; i < curve.length; i += 1) {
    const [hiF, hiPsi] = curve[i];
    if (tF <= hiF) {
      const [loF, loPsi] = curve[i - 1];
      if (tF === hiF) return { psi: hiPsi, how: `${hiPsi} psi at ${hiF} °F`, lowF: hiF, highF: hiF };
      const psi = loPsi + ((hiPsi - loPsi) * (tF - loF)) / (hiF - loF);
      return {
        psi,
        how: `${fmt(psi)} psi at ${fmt(tF)} °F, linear interpolation between ${loF} °F (${loPsi} psi) and ${hiF} °F (${hiPsi} psi)`,
        lowF: loF,
        highF: hiF,
      };
    }
  }
  return null;
}

// ---------------------------------------------------------------- CPVC SDR 11 (ASTM D2846)

// Charlotte Pipe and Foundry, How-to Guide (manufacturer), "Temperature De-Rating for ASTM D 2846 CTS
// CPVC SDR 11 Piping Systems", all sizes: 73 °F 400, 80 °F 400, 90 °F 360, 100 °F 325, 120 °F 260,
// 140 °F 200, 160 °F 160, 180 °F 100 psi (factors 1.00, 1.00, 0.91, 0.82, 0.65, 0.50, 0.40, 0.25 of
// the 400 psi rating at 73 °F). The same factors are GF Harvel's CPVC temperature de-rating table, and
// GF Harvel's HydroKing CTS specification gives the two ends (400 psi at 73 °F, 100 psi at 180 °F);
// 180 °F is the continuous-use limit in ASTM D2846's scope.
const CPVC_SDR11: Curve = [
  [73, 400],
  [80, 400],
  [90, 360],
  [100, 325],
  [120, 260],
  [140, 200],
  [160, 160],
  [180, 100],
];
const CPVC_SOURCE =
  'CPVC CTS SDR 11 (ASTM D2846): Charlotte Pipe How-to Guide (manufacturer), "Temperature De-Rating for ASTM D 2846 CTS CPVC SDR 11 Piping Systems" (73 °F 400, 80 °F 400, 90 °F 360, 100 °F 325, 120 °F 260, 140 °F 200, 160 °F 160, 180 °F 100 psi), factors as GF Harvel\'s CPVC de-rating table; 180 °F is the D2846 continuous-use limit';

// ---------------------------------------------------------------- PEX SDR 9 (ASTM F876)

// ASTM F876 rates PEX "for water at three temperatures (see Appendix X1)"; the Appendix X1 figures
// 160 psi at 73.4 °F, 100 psi at 180 °F and 80 psi at 200 °F were seen only on secondary pages
// (plumbing-trade articles), not in the standard's text: flagged unverified.
const PEX_SDR9: Curve = [
  [73.4, 160],
  [180, 100],
  [200, 80],
];
const PEX_SOURCE = `PEX SDR 9 (ASTM F876 Appendix X1, three rated temperatures: 160 psi at 73.4 °F, 100 psi at 180 °F, 80 psi at 200 °F) as restated by plumbing-trade pages, ${NOT_VERIFIED}`;

// ---------------------------------------------------------------- Copper (ASTM B88), soldered

// CDA Copper Tube Handbook Table 14.3c (formerly 3c), Type M, rated internal working pressure of
// drawn tube, psi, at 100, 150, 200 and 250 °F (drawn allowable stress 10,300 psi over 100–250 °F, so
// the rating is the same at the four temperatures).
const TYPE_M_DRAWN_PSI: Readonly<Record<string, number>> = {
  '3/8': 982,
  '1/2': 850,
  '3/4': 701,
  '1': 580,
  '1-1/4': 582,
  '1-1/2': 569,
  '2': 514,
  '2-1/2': 471,
  '3': 435,
  '4': 431,
};
const TYPE_M_TABLE_TOP_F = 250;
const TYPE_M_SOURCE = 'CDA Copper Tube Handbook Table 14.3c (Type M, drawn, rated internal working pressure, 100–250 °F)';

// CDA "Pressure–temperature ratings for copper tube joints" (Table F, as reproduced by a copper-tube
// supplier), 95-5 tin-antimony solder, psi, by size range: 1/4–1, 1-1/4–2, 2-1/2–4 in.
type JointRange = '1/4–1' | '1-1/4–2' | '2-1/2–4';
const JOINT_95_5: Readonly<Record<JointRange, Curve>> = {
  '1/4–1': [
    [100, 500],
    [150, 400],
    [200, 300],
    [250, 200],
  ],
  '1-1/4–2': [
    [100, 400],
    [150, 350],
    [200, 250],
    [250, 175],
  ],
  '2-1/2–4': [
    [100, 300],
    [150, 275],
    [200, 200],
    [250, 150],
  ],
};
const JOINT_SOURCE =
  'CDA Copper Tube Handbook, Table F "Pressure–temperature ratings for copper tube joints", 95-5 tin-antimony solder (lead free, as potable water requires)';

function jointRange(nominalIn: number): JointRange | null {
  if (nominalIn <= 1) return '1/4–1';
  if (nominalIn <= 2) return '1-1/4–2';
  if (nominalIn <= 4) return '2-1/2–4';
  return null;
}

const NOMINAL_IN: Readonly<Record<string, number>> = {
  '3/8': 0.375,
  '1/2': 0.5,
  '3/4': 0.75,
  '1': 1,
  '1-1/4': 1.25,
  '1-1/2': 1.5,
  '2': 2,
  '2-1/2': 2.5,
  '3': 3,
  '3-1/2': 3.5,
  '4': 4,
};
const COPPER_SIZES = Object.keys(NOMINAL_IN);

function copperRating(type: 'K' | 'L' | 'M', sizeKey: string, tF: number): PressureRating | null {
  const nominal = Object.prototype.hasOwnProperty.call(NOMINAL_IN, sizeKey) ? NOMINAL_IN[sizeKey] : undefined;
  if (nominal === undefined) return null;
  const range = jointRange(nominal);
  if (range === null) return null;
  const joint = readCurve(JOINT_95_5[range], tF);
  if (joint === null) return null;
  if (type === 'M') {
    const tube = TYPE_M_DRAWN_PSI[sizeKey];
    if (tube === undefined || tF > TYPE_M_TABLE_TOP_F) return null;
    const jointGoverns = joint.psi <= tube;
    return {
      ratingPa: Math.min(tube, joint.psi) * PA_PER_PSI,
      source:
        `Soldered Type M copper ${sizeKey} in: ${jointGoverns ? 'the soldered joint governs' : 'the tube governs'} — ` +
        `joint ${joint.how} (${JOINT_SOURCE}, ${range} in); tube ${tube} psi (${TYPE_M_SOURCE}). ` +
        'Brazed joints call for the annealed tube rating instead.',
      verified: true,
    };
  }
  // Types K and L have thicker walls than Type M at every size (ASTM B88) with the same outside
  // diameter, so by P = 2St/(D − 0.8t) their drawn ratings exceed Type M's, which already exceed the
  // 95-5 joint rating at every size and temperature here: the joint governs.
  return {
    ratingPa: joint.psi * PA_PER_PSI,
    source:
      `Soldered Type ${type} copper ${sizeKey} in: the soldered joint governs — joint ${joint.how} (${JOINT_SOURCE}, ${range} in); ` +
      `the drawn Type ${type} tube rating exceeds Type M's (thicker wall, ASTM B88), which exceeds the joint's (${TYPE_M_SOURCE}). ` +
      'Brazed joints call for the annealed tube rating instead.',
    verified: true,
  };
}

/** Every published table behind pressureRating, with its verification status (for unverifiedSources()). */
export const PRESSURE_RATING_SOURCES: readonly { id: string; label: string; source: string; verified: boolean }[] = Object.freeze([
  { id: 'cpvc-sdr11', label: 'CPVC SDR 11 pressure rating', source: CPVC_SOURCE, verified: true },
  { id: 'pex-sdr9', label: 'PEX SDR 9 pressure rating', source: PEX_SOURCE, verified: false },
  { id: 'copper-type-m-drawn', label: 'Copper Type M drawn tube rating', source: TYPE_M_SOURCE, verified: true },
  { id: 'copper-joint-95-5', label: 'Soldered copper joint rating', source: JOINT_SOURCE, verified: true },
]);

function curveRating(curve: Curve, source: string, tF: number, verified: boolean): PressureRating | null {
  const reading = readCurve(curve, tF);
  if (reading === null) return null;
  return { ratingPa: reading.psi * PA_PER_PSI, source: `${source}; rating ${reading.how}`, verified };
}

function ratingOfSize(materialId: string, sizeKey: string, tF: number): PressureRating | null {
  switch (materialId) {
    case 'copper-k':
      return copperRating('K', sizeKey, tF);
    case 'copper-l':
      return copperRating('L', sizeKey, tF);
    case 'copper-m':
      return copperRating('M', sizeKey, tF);
    default:
      return null;
  }
}

/**
 * The working-pressure rating of a catalog material and size at a water temperature.
 *
 * @param materialId catalog material id (src/engine/catalog/materials.ts)
 * @param sizeKey nominal size key ('3/4', '1-1/2', …); null when the size is not known, in which case
 *   a size-dependent material answers with the lowest rating of its sizes
 * @param temperatureC water temperature, °C
 * @returns the rating in Pa with its source and whether it was checked against a published table;
 *   null where no published rating is known or the temperature is above the table
 */
export function pressureRating(materialId: string, sizeKey: string | null, temperatureC: number): PressureRating | null {
  if (!Number.isFinite(temperatureC)) return null;
  const tF = celsiusToFahrenheit(temperatureC);
  switch (materialId) {
    case 'cpvc-sdr11':
      return curveRating(CPVC_SDR11, CPVC_SOURCE, tF, true);
    case 'pex-sdr9':
      return curveRating(PEX_SDR9, PEX_SOURCE, tF, false);
    case 'copper-k':
    case 'copper-l':
    case 'copper-m': {
      if (sizeKey !== null) return ratingOfSize(materialId, sizeKey, tF);
      let lowest: PressureRating | null = null;
      for (const key of COPPER_SIZES) {
        const r = ratingOfSize(materialId, key, tF);
        if (r !== null && (lowest === null || r.ratingPa < lowest.ratingPa)) lowest = r;
      }
      return lowest === null ? null : { ...lowest, source: `size not given, lowest rating of any size: ${lowest.source}` };
    }
    default:
      // PVC Schedule 40/80 and steel Schedule 40: no published pressure–temperature table was found.
      return null;
  }
}
