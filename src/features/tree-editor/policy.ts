/**
 * What the tree editor lets the person change. One editor serves the designer's walk and the
 * contractor's field change; the difference is this object, never a copy of the screen.
 */
import type { ChangedBy } from '../../engine/model/describe';
import { SEGMENT } from '../../engine/model/elements';

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

/** The segment's keys, by the editor columns that write them (from the segment's description). */
const SEGMENT_KEYS_BY_PART = new Map<EditablePart, { key: string; changedBy: ChangedBy }[]>(EDITABLE_PARTS.map((p) => [p, []]));
for (const [key, d] of Object.entries(SEGMENT.keys))
  for (const part of d.editor ?? []) SEGMENT_KEYS_BY_PART.get(part as EditablePart)?.push({ key, changedBy: d.changedBy });

/**
 * A contractor's field change: the columns that write only segment keys a field change may change
 * (`changedBy: 'field-change'` in src/engine/model/elements.ts, the keys server/services/fieldChangeRules.ts
 * allows — material, size, length and fittings), and the devices. The tree itself (segments added or
 * removed, fixtures) and every column writing a key of the designer's (names, rises) stay as issued.
 */
export const CONTRACTOR_POLICY: EditPolicy = {
  id: 'contractor',
  locked: {
    ...open(),
    ...Object.fromEntries([...SEGMENT_KEYS_BY_PART].filter(([, keys]) => keys.some((k) => k.changedBy === 'designer')).map(([part]) => [part, AS_ISSUED])),
    topology: AS_ISSUED,
    fixtures: AS_ISSUED,
  },
};

/** The document keys a policy lets the editor write on a segment (for the check against the server's rule). */
export function segmentKeysWritten(policy: EditPolicy): string[] {
  const keys = new Set<string>();
  for (const [part, written] of SEGMENT_KEYS_BY_PART) if (!policy.locked[part]) for (const k of written) keys.add(k.key);
  return [...keys];
}

/** Everything locked with one reason (an issued revision, a reader). */
export function readOnlyPolicy(reason: string): EditPolicy {
  return { id: 'read-only', locked: Object.fromEntries(EDITABLE_PARTS.map((p) => [p, reason])) as Record<EditablePart, string | null> };
}
