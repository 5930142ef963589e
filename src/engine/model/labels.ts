/**
 * Plain-words names of a document's fittings and fixture groups, for listings (field changes,
 * the PDF, the walk): a catalog entry by its catalog label, an element carrying the project's own
 * data (FittingSchema.custom, FixtureGroupSchema.custom) by its own label, marked as project data
 * with the value it carries so a change of value shows even under the same name.
 */
import { FIXTURE_TYPES } from '../catalog/fixtures';
import { FITTING_TYPES } from '../fittings/types';
import type { Fitting, FixtureGroup } from './schema';

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
