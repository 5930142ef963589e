/**
 * The PEX fitting that takes the place of a metal-pipe fitting when a segment changes from copper
 * (or steel) to PEX: same job (elbow, tee run, tee branch, coupling), in the PEX fitting line the
 * contractor installs. A 45° elbow has no PEX row in the manufacturer's table; it becomes the line's
 * 90° elbow, the larger loss (the substitution must not flatter the result). Valves, entrances and
 * exits fit any pipe and are kept.
 */
import { FITTING_TYPES, PEX_FITTING_LINES, type FittingTypeId } from './types';

export type PexFittingLine = keyof typeof PEX_FITTING_LINES;

const KIND_OF_METAL: Readonly<Record<string, 'elbow-90' | 'tee-run' | 'tee-branch' | 'coupling'>> = {
  'elbow-90-standard': 'elbow-90',
  'elbow-90-long-radius': 'elbow-90',
  'elbow-45-standard': 'elbow-90',
  'tee-run': 'tee-run',
  'tee-branch': 'tee-branch',
  coupling: 'coupling',
};

/** The PEX lines, for a choice list: id stem and label. */
export const PEX_LINES: readonly { id: PexFittingLine; label: string }[] = Object.freeze(
  Object.entries(PEX_FITTING_LINES).map(([id, line]) => ({ id, label: line.label })),
);

/** The PEX fitting of `line` replacing the metal fitting `typeId`; undefined when it is not a metal-pipe fitting. */
export function pexFittingFor(typeId: FittingTypeId, line: PexFittingLine): FittingTypeId | undefined {
  const kind = Object.prototype.hasOwnProperty.call(KIND_OF_METAL, typeId) ? KIND_OF_METAL[typeId] : undefined;
  if (kind === undefined) return undefined;
  const id = `pex-${line}-${kind}`;
  return Object.prototype.hasOwnProperty.call(FITTING_TYPES, id) ? id : undefined;
}

/** True for the fitting types made for metal pipe (the ones a PEX segment should not carry). */
export function isMetalPipeFitting(typeId: FittingTypeId): boolean {
  return Object.prototype.hasOwnProperty.call(FITTING_TYPES, typeId) && FITTING_TYPES[typeId].pipeFamily === 'metal';
}
