/**
 * The project-catalog form: what the designer types, in the project's unit system, becomes the
 * API body in SI (src/shared/api/catalog.ts) through the engine's units module. Problems are
 * named by the form field they belong to.
 */
import { toSI } from '../../../engine';
import type { UnitSystem } from '../../../engine';
import { CreateCatalogEntryBody, type CatalogKind } from '../../../shared/api/catalog';
import { parseCurvePoints, readDelimited } from '../../walk/lib/csv';

export interface EntryFormValues {
  kind: CatalogKind;
  label: string;
  source: string;
  // pipe material
  velocityClass: 'copper' | 'plastic' | 'steel';
  /** diameter unit (in or mm) */
  roughness: string;
  hazenWilliamsC: string;
  /** lines of "size, inside diameter" (diameter unit) */
  sizes: string;
  // fitting type
  k: string;
  // fixture type
  occupancy: 'private' | 'public' | 'assembly';
  demandCurve: 'flush-tank' | 'flush-valve';
  wsfuCold: string;
  wsfuHot: string;
  wsfuTotal: string;
  /** pressure unit */
  minFlowPressure: string;
  /** flow unit */
  flowRate: string;
  // device template
  deviceKind: 'meter' | 'backflow-preventer' | 'prv' | 'strainer' | 'softener' | 'filter' | 'water-heater' | 'booster-pump' | 'other';
  /** lines of "flow, loss" (flow unit, pressure unit) */
  points: string;
}

export const EMPTY_ENTRY_FORM: EntryFormValues = {
  kind: 'material',
  label: '',
  source: '',
  velocityClass: 'plastic',
  roughness: '',
  hazenWilliamsC: '',
  sizes: '',
  k: '',
  occupancy: 'private',
  demandCurve: 'flush-tank',
  wsfuCold: '',
  wsfuHot: '',
  wsfuTotal: '',
  minFlowPressure: '',
  flowRate: '',
  deviceKind: 'meter',
  points: '',
};

/** An empty box is "not given" (NaN, refused by the schema), never 0. */
const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s.trim()));
const orNull = (s: string) => (s.trim() === '' ? null : Number(s.trim()));
const si = (q: 'diameter' | 'pressure' | 'flow', v: number, sys: UnitSystem) => (Number.isFinite(v) ? toSI(q, v, sys) : v);

/** Where each body path is shown on the form. */
const FIELD_OF: Record<string, keyof EntryFormValues> = {
  label: 'label',
  source: 'source',
  'data.velocityClass': 'velocityClass',
  'data.roughnessM': 'roughness',
  'data.hazenWilliamsC': 'hazenWilliamsC',
  'data.sizes': 'sizes',
  'data.k': 'k',
  'data.occupancy': 'occupancy',
  'data.demandCurve': 'demandCurve',
  'data.wsfu.cold': 'wsfuCold',
  'data.wsfu.hot': 'wsfuHot',
  'data.wsfu.total': 'wsfuTotal',
  'data.minFlowPressurePa': 'minFlowPressure',
  'data.flowRateM3s': 'flowRate',
  'data.kind': 'deviceKind',
  'data.points': 'points',
};

function fieldOf(path: (string | number | symbol)[]): keyof EntryFormValues {
  const parts = path.map(String);
  // a problem inside one size or point belongs to its lines box
  if (parts[0] === 'data' && (parts[1] === 'sizes' || parts[1] === 'points')) return FIELD_OF[`data.${parts[1]}`];
  return FIELD_OF[parts.join('.')] ?? 'label';
}

export type EntryFormResult = { ok: true; body: CreateCatalogEntryBody } | { ok: false; errors: Partial<Record<keyof EntryFormValues, string>> };

export function entryBodyFromForm(v: EntryFormValues, sys: UnitSystem): EntryFormResult {
  const errors: Partial<Record<keyof EntryFormValues, string>> = {};
  let data: unknown;
  switch (v.kind) {
    case 'material': {
      const read = readDelimited(v.sizes);
      const sizes = read.rows.map(({ cells }) => ({ key: (cells[0] ?? '').trim(), innerDiameterM: si('diameter', num(cells[1] ?? ''), sys) }));
      // a header line ("size, inside diameter") is skipped, as in the walk's imports
      if (sizes.length && !Number.isFinite(sizes[0].innerDiameterM) && Number.isNaN(Number(read.rows[0].cells[1]))) sizes.shift();
      if (read.errors.length) errors.sizes = read.errors[0];
      data = { velocityClass: v.velocityClass, roughnessM: si('diameter', num(v.roughness), sys), hazenWilliamsC: num(v.hazenWilliamsC), sizes };
      break;
    }
    case 'fitting-type':
      data = { k: num(v.k) };
      break;
    case 'fixture-type':
      data = {
        occupancy: v.occupancy,
        demandCurve: v.demandCurve,
        wsfu: { cold: orNull(v.wsfuCold), hot: orNull(v.wsfuHot), total: num(v.wsfuTotal) },
        minFlowPressurePa: si('pressure', num(v.minFlowPressure), sys),
        flowRateM3s: si('flow', num(v.flowRate), sys),
      };
      break;
    case 'device-template': {
      const read = parseCurvePoints(v.points);
      if (read.errors.length) errors.points = read.errors[0];
      data = { kind: v.deviceKind, points: read.rows.map((p) => ({ flowM3s: toSI('flow', p.flow, sys), lossPa: toSI('pressure', p.loss, sys) })) };
      break;
    }
  }
  const parsed = CreateCatalogEntryBody.safeParse({ kind: v.kind, label: v.label, source: v.source, data });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = fieldOf(issue.path);
      errors[field] ??= /expected number, received NaN/.test(issue.message) ? 'Enter a number' : issue.message;
    }
  }
  if (Object.keys(errors).length || !parsed.success) return { ok: false, errors };
  return { ok: true, body: parsed.data };
}
