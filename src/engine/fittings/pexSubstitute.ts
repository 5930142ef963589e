/**
 * Fitting lines for a substitution: the fittings that take the place of the metal-pipe elbows, tees
 * and couplings when the contractor installs another line.
 * - Copper → PEX: the PEX line installed (PEX_LINES), each fitting by the same job (elbow, tee run,
 *   tee branch, coupling).
 * - Copper kept, soldered → push-to-connect (COPPER_LINES): the elbows and couplings of the line, at
 *   the sizes it was published for; a tee keeps its data (no push-fit tee has a published loss).
 * A 45° elbow has no row in these tables; it becomes the line's 90° elbow, the larger loss (the
 * substitution must not flatter the result). Valves, entrances and exits fit any pipe and are kept.
 */
import { FITTING_TYPES, PEX_FITTING_LINES, PUSH_FITTING_LINES, type FittingTypeEntry, type FittingTypeId } from './types';

export type PexFittingLine = keyof typeof PEX_FITTING_LINES;
export type CopperFittingLine = keyof typeof PUSH_FITTING_LINES;

type FittingJob = 'elbow-90' | 'tee-run' | 'tee-branch' | 'coupling';

const JOB_OF_METAL: Readonly<Record<string, FittingJob>> = {
  'elbow-90-standard': 'elbow-90',
  'elbow-90-long-radius': 'elbow-90',
  'elbow-45-standard': 'elbow-90',
  'tee-run': 'tee-run',
  'tee-branch': 'tee-branch',
  coupling: 'coupling',
};

const has = (o: object, key: string): boolean => Object.prototype.hasOwnProperty.call(o, key);

/** The PEX lines, for a choice list: id stem, label and the sizes published ("1/2–1 in"). */
export const PEX_LINES: readonly { id: PexFittingLine; label: string; sizes: string }[] = Object.freeze(
  Object.entries(PEX_FITTING_LINES).map(([id, line]) => ({ id, label: line.label, sizes: line.sizes })),
);

/** The lines a copper segment may change to, keeping its tube: id stem and label (with the sizes published). */
export const COPPER_LINES: readonly { id: CopperFittingLine; label: string }[] = Object.freeze(
  Object.entries(PUSH_FITTING_LINES).map(([id, line]) => ({ id, label: `${line.label}, ${line.sizes}` })),
);

/**
 * Whether a fitting type has a published loss at a nominal size: a type with a size-free method
 * (Crane N, two- or three-K constants, a constant K) has one at every size; one published by size
 * (equivalent lengths, measured K) only at its sizes.
 */
export function publishedAtSize(entry: FittingTypeEntry, sizeKey: string): boolean {
  if (entry.craneN !== undefined || entry.craneNBySize !== undefined || entry.hooper !== undefined || entry.darby !== undefined) return true;
  if (entry.kBySize !== undefined) return has(entry.kBySize, sizeKey);
  if (entry.equivalentLengthFt !== undefined && has(entry.equivalentLengthFt, sizeKey)) return true;
  return entry.fixedK !== undefined;
}

/** `id` when it is a catalog fitting with data at `sizeKey` (or no size was given), else undefined. */
function ifPublished(id: FittingTypeId, sizeKey: string | undefined): FittingTypeId | undefined {
  if (!has(FITTING_TYPES, id)) return undefined;
  return sizeKey === undefined || publishedAtSize(FITTING_TYPES[id], sizeKey) ? id : undefined;
}

/**
 * The PEX fitting of `line` replacing the metal fitting `typeId`; undefined when it is not a
 * metal-pipe fitting, or (with `sizeKey`) when the line publishes no loss at that size.
 */
export function pexFittingFor(typeId: FittingTypeId, line: PexFittingLine, sizeKey?: string): FittingTypeId | undefined {
  const job = has(JOB_OF_METAL, typeId) ? JOB_OF_METAL[typeId] : undefined;
  return job === undefined ? undefined : ifPublished(`pex-${line}-${job}`, sizeKey);
}

/**
 * The fitting of the copper line `line` replacing the soldered or threaded fitting `typeId` on copper
 * tube: its elbow or coupling; undefined for a tee (none published for the line), for a fitting that is
 * not a metal-pipe fitting, and (with `sizeKey`) at a size the line was not published for.
 */
export function copperFittingFor(typeId: FittingTypeId, line: CopperFittingLine, sizeKey?: string): FittingTypeId | undefined {
  const job = has(JOB_OF_METAL, typeId) ? JOB_OF_METAL[typeId] : undefined;
  if (job !== 'elbow-90' && job !== 'coupling') return undefined;
  return ifPublished(`${line}-${job}`, sizeKey);
}

/** True for the fitting types made for metal pipe (the ones a PEX segment should not carry). */
export function isMetalPipeFitting(typeId: FittingTypeId): boolean {
  return has(FITTING_TYPES, typeId) && FITTING_TYPES[typeId].pipeFamily === 'metal';
}
