/**
 * The building page's form: floors, unit types (piping rows, one per point of the unit) and the
 * riser builder's short form, checked by zod with messages that name the row or field.
 */
import { z } from 'zod';

const num = () => z.number({ error: 'Enter a number' }).refine(Number.isFinite, 'Enter a number');
const positive = () => num().refine((v) => v > 0, 'Must be more than zero');
const nonNegative = () => num().refine((v) => v >= 0, 'Must be zero or more');
const required = (what: string) => z.string().trim().min(1, what);

export const FittingRowSchema = z.object({
  typeId: required('Choose a fitting'),
  count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('Must be 1 or more'),
});

/** One point of a unit and the pipe that feeds it (from the tap or an earlier point). */
export const PipingRowSchema = z.object({
  /** stable key of the row while the form is open; `from` refers to it */
  key: z.string().min(1),
  name: required('Name the point'),
  /** key of the upstream row, or "inlet" for the tap on the floor main */
  from: z.string().min(1),
  heightAboveFloor: nonNegative(),
  /** '' when no fixture is served at this point */
  fixtureTypeId: z.string(),
  count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('Must be 1 or more'),
  checked: z.boolean(),
  material: required('Choose a material'),
  size: required('Choose a size'),
  length: positive(),
  fittings: z.array(FittingRowSchema),
});

export const UnitTypeFormSchema = z
  .object({
    id: z.string().min(1),
    name: required('Name the unit type'),
    rows: z.array(PipingRowSchema).min(1, 'A unit needs at least its branch from the tap'),
  })
  .superRefine((t, ctx) => {
    const keys = new Set<string>();
    t.rows.forEach((r, i) => {
      if (r.from !== 'inlet' && !keys.has(r.from))
        ctx.addIssue({ code: 'custom', path: ['rows', i, 'from'], message: 'Feed it from the tap or a point above it in the list' });
      if (i > 0 && r.from === 'inlet') ctx.addIssue({ code: 'custom', path: ['rows', i, 'from'], message: 'Only the first row starts at the tap' });
      if (r.checked && !r.fixtureTypeId) ctx.addIssue({ code: 'custom', path: ['rows', i, 'checked'], message: 'Only a fixture can be checked' });
      keys.add(r.key);
    });
    if (t.rows[0] && t.rows[0].from !== 'inlet') ctx.addIssue({ code: 'custom', path: ['rows', 0, 'from'], message: 'The first row starts at the tap' });
  });

export const FloorRowSchema = z.object({ name: required('Name the floor'), elevation: num().optional() });

export const UnitPositionSchema = z.object({
  unitTypeId: required('Choose a unit type'),
  labelPattern: required('Name the units'),
  mainLength: positive(),
  /** the unit's branch length here, when it differs from its type's */
  branchLength: positive().optional(),
});

/** A pressure zone by floor range: straight from the start point, through a PRV, or through a booster. */
export const ZoneRowSchema = z
  .object({
    fromFloor: required('Choose a floor'),
    toFloor: required('Choose a floor'),
    feed: z.enum(['supply', 'prv', 'booster-pump']),
    setPressure: positive().optional(),
  })
  .superRefine((zr, ctx) => {
    if (zr.feed !== 'supply' && zr.setPressure === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['setPressure'],
        message: zr.feed === 'prv' ? 'Enter the PRV’s set pressure' : 'Enter the booster’s set discharge pressure',
      });
    }
  });

export const RiserFormSchema = z.object({
  startNodeId: required('Choose where the riser starts'),
  mode: z.enum(['replace', 'append']),
  material: required('Choose the riser material'),
  size: required('Choose the riser size'),
  /** a larger or smaller size from a floor up */
  sizeChanges: z.array(z.object({ fromFloor: required('Choose a floor'), size: required('Choose a size') })),
  /** floor names; '' is the lowest / highest floor */
  fromFloor: z.string(),
  toFloor: z.string(),
  footLength: nonNegative(),
  mainMaterial: required('Choose the floor-main material'),
  mainSize: required('Choose the floor-main size'),
  mainHeight: nonNegative(),
  /** pressure zones by floor range, lowest first; none: one riser straight from the start point */
  zones: z.array(ZoneRowSchema),
});

/** Each floor's elevation as written or filled from the typical height (null where it cannot be). */
export function floorElevations(rows: readonly { elevation?: number }[], typicalHeight: number | undefined): (number | null)[] {
  const out: (number | null)[] = [];
  rows.forEach((r, i) => {
    if (r.elevation !== undefined && Number.isFinite(r.elevation)) out.push(r.elevation);
    else if (i > 0 && out[i - 1] !== null && typicalHeight !== undefined && typicalHeight > 0) out.push(out[i - 1]! + typicalHeight);
    else out.push(null);
  });
  return out;
}

export const FloorsFormSchema = z
  .object({ rows: z.array(FloorRowSchema).min(1, 'Enter at least one floor'), typicalHeight: positive() })
  .superRefine((f, ctx) => {
    const elevations = floorElevations(f.rows, f.typicalHeight);
    const names = new Set<string>();
    f.rows.forEach((r, i) => {
      if (names.has(r.name.trim())) ctx.addIssue({ code: 'custom', path: ['rows', i, 'name'], message: 'Another floor has this name' });
      names.add(r.name.trim());
      if (elevations[i] === null)
        ctx.addIssue({ code: 'custom', path: ['rows', i, 'elevation'], message: i === 0 ? 'The first floor needs an elevation' : 'Enter an elevation' });
      else if (i > 0 && elevations[i - 1] !== null && !(elevations[i]! > elevations[i - 1]!)) {
        ctx.addIssue({
          code: 'custom',
          path: ['rows', i, 'elevation'],
          message: `Not above ${f.rows[i - 1].name || 'the floor below'}: list floors from the lowest up`,
        });
      }
    });
  });

export const BuildingFormSchema = z
  .object({
    floors: FloorsFormSchema,
    unitTypes: z.array(UnitTypeFormSchema).min(1, 'Define at least one unit type'),
    riser: RiserFormSchema,
    units: z.array(UnitPositionSchema).min(1, 'Place at least one unit on the floor main'),
  })
  .superRefine((b, ctx) => {
    const floorNames = new Set(b.floors.rows.map((r) => r.name.trim()));
    const typeIds = new Set(b.unitTypes.map((t) => t.id));
    for (const key of ['fromFloor', 'toFloor'] as const) {
      if (b.riser[key] !== '' && !floorNames.has(b.riser[key]))
        ctx.addIssue({ code: 'custom', path: ['riser', key], message: 'That floor is not in the list' });
    }
    b.riser.zones.forEach((zr, i) => {
      for (const key of ['fromFloor', 'toFloor'] as const) {
        if (!floorNames.has(zr[key])) ctx.addIssue({ code: 'custom', path: ['riser', 'zones', i, key], message: 'That floor is not in the list' });
      }
    });
    b.riser.sizeChanges.forEach((c, i) => {
      if (!floorNames.has(c.fromFloor))
        ctx.addIssue({ code: 'custom', path: ['riser', 'sizeChanges', i, 'fromFloor'], message: 'That floor is not in the list' });
    });
    b.units.forEach((u, i) => {
      if (!typeIds.has(u.unitTypeId)) ctx.addIssue({ code: 'custom', path: ['units', i, 'unitTypeId'], message: 'That unit type does not exist' });
    });
  });

export type FittingRow = z.infer<typeof FittingRowSchema>;
export type PipingRow = z.infer<typeof PipingRowSchema>;
export type UnitTypeForm = z.infer<typeof UnitTypeFormSchema>;
export type FloorsForm = z.infer<typeof FloorsFormSchema>;
export type RiserForm = z.infer<typeof RiserFormSchema>;
export type ZoneRow = z.infer<typeof ZoneRowSchema>;
export type UnitPositionForm = z.infer<typeof UnitPositionSchema>;
export type BuildingForm = z.infer<typeof BuildingFormSchema>;
