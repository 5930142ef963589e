/**
 * Device templates: loss-at-flow curves a designer can start from. Only published figures are
 * here; a backflow preventer, PRV, softener or filter has no generic curve — its loss comes from
 * the data of the product actually installed, so no template is offered for them.
 */
import { M3S_PER_GPM, PA_PER_PSI } from '../units';

export interface DeviceTemplate {
  id: string;
  kind: 'meter';
  label: string;
  /** as published: gpm and psi */
  pointsUS: readonly { flowGpm: number; lossPsi: number }[];
  /** the same in SI base units */
  points: readonly { flowM3s: number; lossPa: number }[];
  source: string;
}

// Displacement meters, pressure loss at flow: the points of a one-page sheet "Water meters – AWWA
// standard pressure loss (psi)" (unattributed utility data sheet); the end points are the AWWA C700
// maximum losses at maximum normal flow (15 psi for 5/8–1 in, 20 psi for 1-1/2–2 in; the C700
// limits themselves are from memory). Verify with the meter actually installed.
const SHEET = 'AWWA C700 displacement meter, loss at flow, as tabulated on an unattributed utility data sheet "Water meters – AWWA standard pressure loss"; verify with the installed meter';

const meter = (id: string, label: string, pointsUS: [number, number][]): DeviceTemplate => ({
  id,
  kind: 'meter',
  label,
  pointsUS: pointsUS.map(([flowGpm, lossPsi]) => ({ flowGpm, lossPsi })),
  points: pointsUS.map(([q, p]) => ({ flowM3s: q * M3S_PER_GPM, lossPa: p * PA_PER_PSI })),
  source: SHEET,
});

export const DEVICE_TEMPLATES: readonly DeviceTemplate[] = Object.freeze([
  meter('meter-displacement-5-8', 'Displacement meter, 5/8 in', [[1, 0.2], [5, 0.9], [10, 3.7], [15, 8.3], [20, 15.0]]),
  meter('meter-displacement-1', 'Displacement meter, 1 in', [[10, 0.7], [20, 2.2], [30, 5.3], [40, 9.6], [50, 15.0]]),
  meter('meter-displacement-2', 'Displacement meter, 2 in', [[50, 1.9], [100, 7.8], [150, 17.3], [160, 20.0]]),
]);
