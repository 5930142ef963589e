import { fromSI } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { num } from '../../../shared/format/quantity';

/** A material's sizes as select options that show each inside diameter in the document's unit. */
export function sizeChoices(sizes: readonly { key: string; innerDiameterM: number }[], sys: SystemDocument['unitSystem'], unit: string) {
  return [
    { value: '', label: 'Choose a size…' },
    ...sizes.map((s) => ({ value: s.key, label: `${s.key} — inside ${num(fromSI('diameter', s.innerDiameterM, sys), unit)} ${unit}` })),
  ];
}
