/** Select options from the catalog, in the walk's words. */
import type { Catalog } from '../../systems/api/get-catalog';

export const materialChoices = (catalog: Catalog) => [{ value: '', label: 'Choose…' }, ...catalog.materials.map((m) => ({ value: m.id, label: m.label }))];

export const sizeChoicesOf = (catalog: Catalog, materialId: string) => [
  { value: '', label: 'Size…' },
  ...(catalog.material(materialId)?.data.sizes ?? []).map((s) => ({ value: s.key, label: `${s.key} in` })),
];

export const fixtureChoices = (catalog: Catalog) => [
  { value: '', label: 'No fixture (a junction)' },
  ...catalog.fixtureTypes.map((f) => ({ value: f.id, label: f.label })),
];

export const fittingChoices = (catalog: Catalog) => [{ value: '', label: 'Fitting…' }, ...catalog.fittingTypes.map((f) => ({ value: f.id, label: f.label }))];
