/** The steps of the walk, in order, from the supply to the result. */
export const WALK_STEPS = [
  { id: 'supply', label: 'Supply', title: 'Supply' },
  { id: 'devices', label: 'Meter & devices', title: 'Meter and in-line devices' },
  { id: 'risers', label: 'Risers', title: 'Risers, branches and demand' },
  { id: 'fittings', label: 'Fittings', title: 'Fittings and valves' },
  { id: 'elevation', label: 'Elevation', title: 'Node elevations and floors' },
  { id: 'fixtures', label: 'Remote fixture', title: 'Checked fixtures and the remote one' },
  { id: 'result', label: 'Result', title: 'Result' },
] as const;

export type WalkStepId = (typeof WALK_STEPS)[number]['id'];
/** A step as the step links show it (a field change has steps of its own too). */
export type StepLink = { id: string; label: string };

export function isWalkStep(value: string | undefined): value is WalkStepId {
  return WALK_STEPS.some((s) => s.id === value);
}

export function stepIndex(step: WalkStepId): number {
  return WALK_STEPS.findIndex((s) => s.id === step);
}
