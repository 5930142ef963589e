import { MATERIALS } from '../../src/engine/catalog/materials';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { FITTING_TYPES } from '../../src/engine/fittings/types';
import { DEVICE_TEMPLATES } from '../../src/engine/catalog/deviceTemplates';

export interface CatalogRow {
  kind: 'material' | 'fitting-type' | 'fixture-type' | 'device-template';
  id: string;
  label: string;
  source: string;
  from_memory: boolean;
  data: unknown;
}

/** The seeded catalog rows, taken from the engine's catalogs (one source of truth for the numbers). */
export function catalogRows(): CatalogRow[] {
  return [
    ...Object.values(MATERIALS).map((m) => ({
      kind: 'material' as const,
      id: m.id,
      label: m.label,
      source: [m.dimensionSource, m.roughnessSource, m.hazenWilliamsSource].join('; '),
      from_memory: !m.verified,
      data: m,
    })),
    ...Object.values(FITTING_TYPES).map((f) => ({
      kind: 'fitting-type' as const,
      id: f.id,
      label: f.label,
      source: f.sources.join('; '),
      from_memory: !f.verified,
      data: f,
    })),
    ...Object.values(FIXTURE_TYPES).map((f) => ({
      kind: 'fixture-type' as const,
      id: f.id,
      label: `${f.label} (${f.occupancy})`,
      source: f.source,
      from_memory: !f.verified,
      data: f,
    })),
    ...DEVICE_TEMPLATES.map((d) => ({ kind: 'device-template' as const, id: d.id, label: d.label, source: d.source, from_memory: !d.verified, data: d })),
  ];
}
