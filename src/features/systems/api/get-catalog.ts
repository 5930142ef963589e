import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/** The parts of each catalog entry's data the walk reads; the rest of the entry is kept as it is. */
const MaterialData = z.object({
  velocityClass: z.string(),
  sizes: z.array(z.object({ key: z.string(), nominalIn: z.number(), innerDiameterM: z.number() })),
});
const FittingTypeData = z.object({ sources: z.array(z.string()).default([]) });
const FixtureTypeData = z.object({
  minFlowPressurePa: z.number(),
  flowRateM3s: z.number(),
  demandCurve: z.string(),
  wsfu: z.object({ cold: z.number().nullable(), hot: z.number().nullable(), total: z.number() }),
});
const DeviceTemplateData = z.object({ kind: z.string(), points: z.array(z.object({ flowM3s: z.number(), lossPa: z.number() })) });

const Base = { id: z.string(), label: z.string(), source: z.string(), fromMemory: z.boolean() };
const Entry = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('material'), ...Base, data: MaterialData }),
  z.object({ kind: z.literal('fitting-type'), ...Base, data: FittingTypeData }),
  z.object({ kind: z.literal('fixture-type'), ...Base, data: FixtureTypeData }),
  z.object({ kind: z.literal('device-template'), ...Base, data: DeviceTemplateData }),
]);
export const CatalogResponse = z.object({ entries: z.array(Entry) });
export type CatalogEntry = z.infer<typeof Entry>;
type OfKind<K extends CatalogEntry['kind']> = Extract<CatalogEntry, { kind: K }>;

export interface Catalog {
  materials: OfKind<'material'>[];
  fittingTypes: OfKind<'fitting-type'>[];
  fixtureTypes: OfKind<'fixture-type'>[];
  deviceTemplates: OfKind<'device-template'>[];
  material: (id: string | undefined) => OfKind<'material'> | undefined;
  fittingType: (id: string) => OfKind<'fitting-type'> | undefined;
  fixtureType: (id: string) => OfKind<'fixture-type'> | undefined;
}

export function indexCatalog(entries: readonly CatalogEntry[]): Catalog {
  const of = <K extends CatalogEntry['kind']>(kind: K) => entries.filter((e): e is OfKind<K> => e.kind === kind);
  const materials = of('material');
  const fittingTypes = of('fitting-type');
  const fixtureTypes = of('fixture-type');
  const byId = <T extends { id: string }>(list: T[]) => {
    const map = new Map(list.map((e) => [e.id, e]));
    return (id: string | undefined) => (id === undefined ? undefined : map.get(id));
  };
  const fitting = byId(fittingTypes);
  const fixture = byId(fixtureTypes);
  return {
    materials,
    fittingTypes,
    fixtureTypes,
    deviceTemplates: of('device-template'),
    material: byId(materials),
    fittingType: (id) => fitting(id),
    fixtureType: (id) => fixture(id),
  };
}

/** The seeded catalogs (materials, fitting types, fixture types, device templates), each entry with its source. */
export async function getCatalog(signal?: AbortSignal): Promise<Catalog> {
  const { entries } = await api.get(systemUrls.catalog(), CatalogResponse, signal);
  return indexCatalog(entries);
}

export const catalogQueryOptions = () => queryOptions({ queryKey: systemKeys.catalog(), queryFn: ({ signal }) => getCatalog(signal), staleTime: Infinity });

export function useCatalog() {
  return useQuery(catalogQueryOptions());
}
