/** Input errors of the hot-water calculations (expansion tank, recirculation): a stable code, the field, plain words. */
export type HotWaterErrorCode =
  | 'heater-volume-not-positive'
  | 'relief-not-above-supply'
  | 'hot-not-above-cold'
  | 'temperature-out-of-range'
  | 'pressure-out-of-range'
  | 'loop-not-closed'
  | 'loop-empty'
  | 'heat-loss-missing'
  | 'temperature-drop-not-positive'
  | 'no-size-passes'
  | 'size-missing'
  | 'unknown-catalog-entry';

export class HotWaterInputError extends Error {
  override readonly name = 'HotWaterInputError';
  constructor(
    readonly code: HotWaterErrorCode,
    readonly field: string | null,
    message: string,
    readonly elementId: string | null = null,
  ) {
    super(message);
  }
}
