/**
 * A field change walks the same steps as the design, with the pipe step in place of the risers
 * (a contractor changes material, size and length, never the tree) and the side by side in place
 * of the result. What a contractor may change is the server's rule (src/shared/api/fieldChanges.ts).
 */
export const FIELD_CHANGE_STEPS = [
  { id: 'supply', label: 'Supply', editable: false },
  { id: 'devices', label: 'Meter & devices', editable: true },
  { id: 'pipe', label: 'Pipe & sizes', editable: true },
  { id: 'fittings', label: 'Fittings', editable: true },
  { id: 'elevation', label: 'Elevation', editable: false },
  { id: 'fixtures', label: 'Remote fixture', editable: false },
  { id: 'effect', label: 'Side by side', editable: false },
] as const;

export type FieldChangeStepId = (typeof FIELD_CHANGE_STEPS)[number]['id'];

export function isFieldChangeStep(value: string | undefined): value is FieldChangeStepId {
  return FIELD_CHANGE_STEPS.some((s) => s.id === value);
}

/** Why a step stays as the designer issued it. */
export const LOCKED_STEP_REASON =
  'This stays as the designer issued it: a field change substitutes fittings, pipe material, sizes and lengths, and devices. Ask the designer of record for any other change.';
