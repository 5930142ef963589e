/**
 * The catalogs: the seeded entries (the engine's cited catalogs, project_id null) and a project's
 * own entries, which its designers add with the source they took the numbers from ("manufacturer's
 * data sheet X, 2025"). Every number is in SI base units (m, Pa, m³/s), like the engine's catalogs;
 * the screens convert to the project's unit system.
 *
 * A project entry never reaches the engine by reference: when it is chosen in the walk its data is
 * copied into the system document (a pipe as the segment's `custom` pipe, a device template as the
 * device's curve), so a stored document analyses the same on the client and the server.
 *
 * The upper bounds below are sanity bounds against typing errors (a value in the wrong unit), not
 * physical limits; each says what it is well beyond.
 */
import { z } from 'zod';

export const CATALOG_KINDS = ['material', 'fitting-type', 'fixture-type', 'device-template'] as const;
export const CatalogKind = z.enum(CATALOG_KINDS);
export type CatalogKind = z.infer<typeof CatalogKind>;

/** The device kinds of the document format (src/engine/model/schema.ts, DeviceSchema.kind). */
export const DEVICE_KINDS = ['meter', 'backflow-preventer', 'prv', 'strainer', 'softener', 'filter', 'water-heater', 'booster-pump', 'other'] as const;

const text = (max: number, what: string) => z.string().trim().min(1, `Enter ${what}`).max(max);
const label = text(120, 'a name');
/** where the numbers came from, as the designer states it */
const source = text(500, 'where the numbers come from');

export const MaterialEntryData = z.strictObject({
  velocityClass: z.enum(['copper', 'plastic', 'steel']),
  /** absolute roughness, m; 0.01 m (10 mm) is far beyond any pipe's published roughness */
  roughnessM: z.number().nonnegative().max(0.01),
  /** Hazen–Williams C; 200 is beyond any published C (new plastic pipe is about 150, common practice) */
  hazenWilliamsC: z.number().positive().max(200),
  sizes: z
    .array(
      z.strictObject({
        key: text(20, 'the size'),
        /** inside diameter, m; 2 m is beyond any building water pipe */
        innerDiameterM: z.number().positive().max(2),
      }),
    )
    .min(1, 'Give at least one size')
    .max(60)
    .refine((sizes) => new Set(sizes.map((s) => s.key)).size === sizes.length, 'Each size appears once'),
});

export const FittingEntryData = z.strictObject({
  /** loss coefficient K (velocity heads); 1000 is beyond any published fitting or valve K */
  k: z.number().nonnegative().max(1000),
});

export const FixtureEntryData = z.strictObject({
  occupancy: z.enum(['private', 'public', 'assembly']),
  demandCurve: z.enum(['flush-tank', 'flush-valve']),
  /** water supply fixture units per fixture; 100 is beyond any tabulated single fixture */
  wsfu: z.strictObject({
    cold: z.number().nonnegative().max(100).nullable(),
    hot: z.number().nonnegative().max(100).nullable(),
    total: z.number().nonnegative().max(100),
  }),
  /** minimum flow pressure, Pa; 2 MPa (about 290 psi) is beyond any fixture's requirement */
  minFlowPressurePa: z.number().nonnegative().max(2e6),
  /** flow at the fixture, m³/s; 0.1 m³/s (about 1,600 gpm) is beyond any single fixture */
  flowRateM3s: z.number().positive().max(0.1),
});

export const DeviceTemplateEntryData = z.strictObject({
  kind: z.enum(DEVICE_KINDS),
  /** loss at flow points (m³/s, Pa); zero loss at zero flow is implied, as in the document format */
  points: z
    .array(z.strictObject({ flowM3s: z.number().nonnegative().max(1), lossPa: z.number().nonnegative().max(1e7) }))
    .min(1, 'Give at least one point')
    .max(50),
});

export const ENTRY_DATA = {
  material: MaterialEntryData,
  'fitting-type': FittingEntryData,
  'fixture-type': FixtureEntryData,
  'device-template': DeviceTemplateEntryData,
} as const satisfies Record<CatalogKind, z.ZodType>;
export type EntryData<K extends CatalogKind> = z.infer<(typeof ENTRY_DATA)[K]>;

export const CreateCatalogEntryBody = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('material'), label, source, data: MaterialEntryData }),
  z.strictObject({ kind: z.literal('fitting-type'), label, source, data: FittingEntryData }),
  z.strictObject({ kind: z.literal('fixture-type'), label, source, data: FixtureEntryData }),
  z.strictObject({ kind: z.literal('device-template'), label, source, data: DeviceTemplateEntryData }),
]);
export type CreateCatalogEntryBody = z.infer<typeof CreateCatalogEntryBody>;

/** The body of a change to an entry of `kind` (the kind is in the address and does not change). */
export function updateCatalogEntryBody<K extends CatalogKind>(kind: K) {
  return z.strictObject({
    label: label.optional(),
    source: source.optional(),
    data: (ENTRY_DATA[kind] as (typeof ENTRY_DATA)[K]).optional(),
    version: z.number().int().min(1),
  });
}
export type UpdateCatalogEntryBody<K extends CatalogKind = CatalogKind> = z.infer<ReturnType<typeof updateCatalogEntryBody<K>>>;

export const CatalogEntryParams = z.object({
  projectId: z.string(),
  kind: CatalogKind,
  entryId: z.uuid(),
});

const ownBase = {
  id: z.string(),
  label: z.string(),
  source: z.string(),
  fromMemory: z.literal(false),
  projectId: z.string(),
  version: z.number().int(),
  createdBy: z.string().nullable(),
  updatedAt: z.string(),
};
/** A project's own entry as the API presents it. */
export const ProjectCatalogEntry = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('material'), ...ownBase, data: MaterialEntryData }),
  z.object({ kind: z.literal('fitting-type'), ...ownBase, data: FittingEntryData }),
  z.object({ kind: z.literal('fixture-type'), ...ownBase, data: FixtureEntryData }),
  z.object({ kind: z.literal('device-template'), ...ownBase, data: DeviceTemplateEntryData }),
]);
export type ProjectCatalogEntry = z.infer<typeof ProjectCatalogEntry>;
export type ProjectEntryOf<K extends CatalogKind> = Extract<ProjectCatalogEntry, { kind: K }>;

/** A seeded entry: its data is the engine catalog's row as it is (read loosely by the client). */
export const SeededCatalogEntry = z.object({
  kind: CatalogKind,
  id: z.string(),
  label: z.string(),
  source: z.string(),
  fromMemory: z.boolean(),
  data: z.unknown(),
});

/** GET /api/projects/:projectId/catalog: the seeded entries, then the project's own. */
export const ProjectCatalogResponse = z.object({
  entries: z.array(SeededCatalogEntry),
  projectEntries: z.array(ProjectCatalogEntry),
});
export type ProjectCatalogResponse = z.infer<typeof ProjectCatalogResponse>;

export const ProjectCatalogEntryResponse = z.object({ entry: ProjectCatalogEntry });
