import { fromSI } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { fmt } from './format';

/** A material's sizes as select options that show each inside diameter in the document's unit. */
export function sizeChoices(sizes: readonly { key: string; innerDiameterM: number }[], sys: SystemDocument['unitSystem'], unit: string) {
  return [
    { value: '', label: 'Choose a size…' },
    ...sizes.map((s) => ({ value: s.key, label: `${s.key} — inside ${fmt(fromSI('diameter', s.innerDiameterM, sys), sys === 'US' ? 3 : 1)} ${unit}` })),
  ];
}
