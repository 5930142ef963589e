/**
 * Device templates: loss-at-flow curves a designer can start from. Only published figures are
 * here; a backflow preventer, PRV, softener or filter has no generic curve — its loss comes from
 * the data of the product actually installed, so no template is offered for them.
 */
import { M3S_PER_GPM, PA_PER_PSI } from '../units';
import { NOT_VERIFIED } from './notVerified';

export interface DeviceTemplate {
  id: string;
  kind: 'meter';
  label: string;
  /** as published: gpm and psi */
  pointsUS: readonly { flowGpm: number; lossPsi: number }[];
  /** the same in SI base units */
  points: readonly { flowM3s: number; lossPa: number }[];
  source: string;
  /** false: the points could not be checked against the standard (see the source). */
  verified: boolean;
}

// Displacement meters, pressure loss at flow. The points come from a one-page data sheet whose author
// is not named, so it is not a citable source; its end points are the maximum losses at maximum
// normal flow that AWWA C700 is believed to set (15 psi for 5/8–1 in, 20 psi for 1-1/2–2 in), but the
// standard's own clause was not seen. Flagged unverified: the installed meter's published curve governs.
const SHEET = `AWWA C700 displacement meter, typical loss at flow ending at the standard's maximum loss at maximum normal flow, ${NOT_VERIFIED}; use the installed meter's published loss curve`;

const meter = (id: string, label: string, pointsUS: [number, number][]): DeviceTemplate => ({
  id,
  kind: 'meter',
  label,
  pointsUS: pointsUS.map(([flowGpm, lossPsi]) => ({ flowGpm, lossPsi })),
  points: pointsUS.map(([q, p]) => ({ flowM3s: q * M3S_PER_GPM, lossPa: p * PA_PER_PSI })),
  source: SHEET,
  verified: false,
});

export const DEVICE_TEMPLATES: readonly DeviceTemplate[] = Object.freeze([
  meter('meter-displacement-5-8', 'Displacement meter, 5/8 in', [
    [1, 0.2],
    [5, 0.9],
    [10, 3.7],
    [15, 8.3],
    [20, 15.0],
  ]),
  meter('meter-displacement-1', 'Displacement meter, 1 in', [
    [10, 0.7],
    [20, 2.2],
    [30, 5.3],
    [40, 9.6],
    [50, 15.0],
  ]),
  meter('meter-displacement-2', 'Displacement meter, 2 in', [
    [50, 1.9],
    [100, 7.8],
    [150, 17.3],
    [160, 20.0],
  ]),
]);
