/**
 * Plain-words names of a document's fittings and fixture groups, for listings (field changes,
 * the PDF, the walk): a catalog entry by its catalog label, an element carrying the project's own
 * data (FittingSchema.custom, FixtureGroupSchema.custom) by its own label, marked as project data
 * with the value it carries so a change of value shows even under the same name.
 */
import { FIXTURE_TYPES } from '../catalog/fixtures';
import { FITTING_TYPES } from '../fittings/types';
import type { Boost, Device, Fitting, FixtureGroup, Source } from './schema';

/*
 * The words the screens and the issued summary share, so the paper says what the screen said:
 * a device's kind, a source's kind, a warning's severity.
 */
export const DEVICE_KIND_LABELS: Record<Device['kind'], string> = {
  meter: 'Meter',
  'backflow-preventer': 'Backflow preventer',
  prv: 'Pressure-reducing valve',
  strainer: 'Strainer',
  softener: 'Softener',
  filter: 'Filter',
  'water-heater': 'Water heater',
  'booster-pump': 'Booster pump',
  other: 'Other device',
};
export const SOURCE_KIND_LABELS: Record<Source['kind'], string> = { 'utility-main': 'Utility main', tank: 'Tank', 'booster-outlet': 'Booster pump outlet' };
/** A warning's severity in words: a criterion not met, a caution, a note. */
export const WARNING_SEVERITY_WORDS = { fail: 'Not met', caution: 'Caution', note: 'Note' } as const;

/** "90° standard elbow", or "Ball valve (project data, K 0.05)" / "Y-strainer (project data, equivalent length 4 ft)". */
export function fittingLabel(f: Fitting, lengthUnit?: string): string {
  const own = f.custom;
  if (!own) return (Object.prototype.hasOwnProperty.call(FITTING_TYPES, f.typeId) ? FITTING_TYPES[f.typeId].label : undefined) ?? f.typeId;
  const value = 'k' in own ? `K ${own.k}` : `equivalent length ${own.equivalentLength}${lengthUnit ? ` ${lengthUnit}` : ''}`;
  return `${own.label} (project data, ${value})`;
}

/** "Lavatory", or "Bar sink (project data)". */
export function fixtureGroupLabel(g: FixtureGroup): string {
  if (g.custom) return `${g.custom.label} (project data)`;
  return (Object.prototype.hasOwnProperty.call(FIXTURE_TYPES, g.fixtureTypeId) ? FIXTURE_TYPES[g.fixtureTypeId].label : undefined) ?? g.fixtureTypeId;
}

/** Fixture units per fixture of a group on a basis: its own data when it has some, else the catalog type's; null when unknown. */
export function fixtureGroupWsfu(g: FixtureGroup, basis: 'cold' | 'hot' | 'total'): number | null {
  if (g.custom) return (basis === 'cold' ? g.custom.wsfuCold : basis === 'hot' ? g.custom.wsfuHot : g.custom.wsfuTotal) ?? 0;
  const t = Object.prototype.hasOwnProperty.call(FIXTURE_TYPES, g.fixtureTypeId) ? FIXTURE_TYPES[g.fixtureTypeId] : undefined;
  return t ? (t.wsfu[basis] ?? null) : null;
}

/** A booster's gain at its design point (null for a variable-speed pump, which holds a discharge pressure). */
export function boosterDesignGain(b: Boost): number | null {
  if ('gain' in b) return b.gain;
  return b.control === 'constant-speed' ? b.designGain : null;
}

/** A booster in words, in the document's pressure unit: "adds 30 psi", "adds 30 psi (42 psi at shutoff)", "holds 85 psi discharge". */
export function boosterText(b: Boost, pressureUnit: string): string {
  const n = (v: number) => String(Math.round(v * 100) / 100);
  if ('gain' in b) return `adds ${n(b.gain)} ${pressureUnit} (shutoff not given)`;
  if (b.control === 'constant-speed') return `adds ${n(b.designGain)} ${pressureUnit} (${n(b.shutoffGain)} ${pressureUnit} at shutoff)`;
  return `holds ${n(b.setPressure)} ${pressureUnit} discharge`;
}
