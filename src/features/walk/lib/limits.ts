/**
 * Plain limits on the walk's number fields: a value outside its plausible range is refused with
 * a message that says the range ("Out of range: length 0–5,000 ft") and never reaches the draft.
 * The ranges and messages are the engine's own (src/engine/model/limits.ts, `checkRange`), so the
 * screen refuses exactly what the engine would refuse with `value-out-of-range`.
 */
import { checkRange, rangeText as engineRangeText } from '../../../engine';
import type { LimitQuantity, UnitSystem } from '../../../engine';

export type LimitKind = LimitQuantity;

/** Which limit a form field has, by its own name (the last part of its path). */
const BY_FIELD: Record<string, LimitQuantity> = {
  length: 'length',
  rise: 'rise',
  elevation: 'elevation',
  connectionElevation: 'elevation',
  heightAboveFloor: 'heightAboveFloor',
  staticPressureLow: 'staticPressure',
  staticPressureHigh: 'staticPressure',
  staticPressure: 'staticPressure',
  residualPressure: 'staticPressure',
  minFlowPressure: 'minFlowPressure',
  prvSet: 'pressureSetting',
  setPressure: 'pressureSetting',
  boostGain: 'pressureGain',
  designGain: 'pressureGain',
  shutoffGain: 'pressureGain',
  boostShutoff: 'pressureGain',
  boostSet: 'pressureSetting',
  prvFalloff: 'pressureFalloff',
  fixedLoss: 'pressureLoss',
  loss: 'pressureLoss',
  waterTemperature: 'waterTemperature',
  flow: 'flow',
  flowOverride: 'flow',
  continuousDemand: 'flow',
  innerDiameter: 'innerDiameter',
  roughness: 'roughness',
  hazenWilliamsC: 'hazenWilliamsC',
  durationSeconds: 'useDuration',
  recurrenceSeconds: 'useInterval',
};

export function limitKindOf(path: string): LimitQuantity | null {
  const parts = path.split('.');
  const key = parts[parts.length - 1] ?? '';
  if (key === 'count') return parts.includes('fittings') ? 'fittingCount' : parts.includes('fixtureGroups') ? 'fixtureCount' : null;
  if (key === 'flow' && parts.includes('usage')) return 'fixtureFlow';
  return BY_FIELD[key] ?? null;
}

/** "length 0–5,000 ft": the range in words, in the document's units (the engine's wording). */
export function rangeText(kind: LimitQuantity, system: UnitSystem): string {
  return engineRangeText(kind, system);
}

/** The message for a value outside its range, or null when it is within. */
export function rangeMessage(kind: LimitQuantity, value: number, system: UnitSystem): string | null {
  return checkRange(kind, value, system);
}
