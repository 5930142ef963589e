/**
 * What the tree editor lets the person change. One editor serves the designer's walk and the
 * contractor's field change; the difference is this object, never a copy of the screen.
 */

/** The parts of a segment the editor can change, each a column or an action. */
export const EDITABLE_PARTS = ['name', 'material', 'size', 'length', 'rise', 'fittings', 'devices', 'topology', 'fixtures'] as const;
export type EditablePart = (typeof EDITABLE_PARTS)[number];

export interface EditPolicy {
  id: 'designer' | 'contractor' | 'read-only';
  /** per part: null when it may be changed, else the reason it is locked (shown as the cell's title and description) */
  locked: Record<EditablePart, string | null>;
}

const open = (): Record<EditablePart, string | null> => Object.fromEntries(EDITABLE_PARTS.map((p) => [p, null])) as Record<EditablePart, string | null>;

/** The designer of a draft: everything. */
export const DESIGNER_POLICY: EditPolicy = { id: 'designer', locked: open() };

const AS_ISSUED = 'Stays as the designer issued it: a field change substitutes pipe material, size, length and fittings, and devices.';

/**
 * A contractor's field change: material, size, length and fittings of each issued segment, and the
 * devices — the segment keys server/services/fieldChangeRules.ts allows (SEGMENT_KEYS_ALLOWED; a
 * test keeps the two in step). The tree itself (segments added or removed, names, rises, fixtures)
 * stays as issued.
 */
export const CONTRACTOR_POLICY: EditPolicy = {
  id: 'contractor',
  locked: { ...open(), name: AS_ISSUED, rise: AS_ISSUED, topology: AS_ISSUED, fixtures: AS_ISSUED },
};

/** The document keys a policy lets the editor write on a segment (for the check against the server's rule). */
export function segmentKeysWritten(policy: EditPolicy): string[] {
  const keys: string[] = [];
  if (!policy.locked.name) keys.push('label');
  if (!policy.locked.material) keys.push('material', 'custom');
  if (!policy.locked.size) keys.push('size', 'custom');
  if (!policy.locked.length) keys.push('length');
  if (!policy.locked.rise) keys.push('rise');
  if (!policy.locked.fittings) keys.push('fittings');
  return [...new Set(keys)];
}

/** Everything locked with one reason (an issued revision, a reader). */
export function readOnlyPolicy(reason: string): EditPolicy {
  return { id: 'read-only', locked: Object.fromEntries(EDITABLE_PARTS.map((p) => [p, reason])) as Record<EditablePart, string | null> };
}
