/**
 * A form row's label and help read from the system document's description (src/engine/model/elements.ts),
 * so a screen names a key as the description does: the description's `label`, the unit its range
 * gives in the document's unit system (limits.ts), and its `help` as the field's hint (read out with
 * the field through aria-describedby).
 */
import type { z } from 'zod';
import type { AnyElement } from '../../../engine/model/describe';
import { fieldUnit, type UnitSystem } from '../../../engine';

export interface DescribedField {
  label: string;
  hint?: string;
}

type KeyOf<E extends AnyElement> = keyof z.output<E['schema']> & string;

function describe<E extends AnyElement>(
  element: E,
  key: KeyOf<E>,
  unitSystem: UnitSystem,
  name: (label: string) => string,
  form: 'label' | 'short' = 'label',
): DescribedField {
  const described = element.keys[key];
  if (!described) throw new Error(`${element.name} has no key "${key}"`);
  const unit = described.range ? fieldUnit(described.range, unitSystem) : '';
  const label = name(form === 'short' ? (described.short ?? described.label) : described.label);
  return { label: unit === '' ? label : `${label} (${unit})`, ...(described.help ? { hint: described.help } : {}) };
}

/**
 * `{ label, hint }` of a described key: "Static pressure, low (psi)" with its help. `after` names
 * what the row edits where a step shows several ("Elevation" + "of the connection").
 */
export function describedField<E extends AnyElement>(element: E, key: KeyOf<E>, unitSystem: UnitSystem, opts: { after?: string } = {}): DescribedField {
  return describe(element, key, unitSystem, (label) => (opts.after ? `${label} ${opts.after}` : label));
}

/**
 * The label's first letter in lower case, inside a sentence ("Developed length" → "developed
 * length"), unless its first word is a name or an abbreviation with other capitals ("PRV …",
 * "Hazen–Williams C").
 */
export function inSentence(label: string): string {
  const first = label.split(' ')[0];
  return /[A-Z]/.test(first.slice(1)) ? label : label.charAt(0).toLowerCase() + label.slice(1);
}

/**
 * `{ label, hint }` of a described key in a table cell or a repeated row, named with its row and
 * the key's `short` name where it has one ("Device 2" + "loss at any flow (psi)", "Level 3 branch:
 * fixture group 1" + "count", "Level 3 branch: fixture group 1" + "type" — not "fixture type").
 */
export function describedCell<E extends AnyElement>(row: string, element: E, key: KeyOf<E>, unitSystem: UnitSystem): DescribedField {
  return describe(element, key, unitSystem, (label) => `${row} ${inSentence(label)}`, 'short');
}

/**
 * `{ label, hint }` of a described key as a table column's header over the element's rows: its
 * `short` name where it has one, with the unit ("Length (ft)" over segments, "Type" over fittings).
 */
export function describedColumn<E extends AnyElement>(element: E, key: KeyOf<E>, unitSystem: UnitSystem): DescribedField {
  return describe(element, key, unitSystem, (label) => label, 'short');
}
