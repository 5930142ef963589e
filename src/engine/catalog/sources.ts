/**
 * Every source string the engine ships with its data (catalogs, criteria, tables, method registries),
 * with whether the value behind it was checked against a printed code, standard or table. Screens and
 * the PDF list unverifiedSources() with the caution NOT_VERIFIED; a test holds every string to the
 * rules (no "from memory" wording, no software library's file named, the flag and the words agree).
 */
import { MATERIALS } from './materials';
import { FIXTURE_TYPES } from './fixtures';
import { DEVICE_TEMPLATES } from './deviceTemplates';
import { CRITERIA_SOURCES, DEFAULT_CRITERIA } from './criteria';
import { PRESSURE_RATING_SOURCES } from './pressureRatings';
import { NOT_VERIFIED } from './notVerified';
import { FITTING_TYPES } from '../fittings/types';
import { HUNTER_TABLE_IPC_SOURCE, HUNTER_TABLE_IPC_VERIFIED } from '../demand/hunterTable';
import { FRICTION_METHODS } from '../friction/registry';
import { FITTING_METHODS } from '../fittings/methods';
import { DEMAND_METHODS } from '../demand/methods';

export { NOT_VERIFIED };

export type SourceKind =
  | 'material'
  | 'fixture-type'
  | 'fitting-type'
  | 'device-template'
  | 'demand-table'
  | 'friction-method'
  | 'fitting-method'
  | 'demand-method'
  | 'criteria'
  | 'pressure-rating';

export interface ShippedSource {
  kind: SourceKind;
  /** id of the catalog entry, method or criterion */
  id: string;
  /** the datum the source speaks for (e.g. 'dimensions', 'crane', 'source') */
  field: string;
  /** a plain name for a reader ("Copper tube, Type L", "Tee, flow through branch") */
  label: string;
  source: string;
  verified: boolean;
}

/** True when a source line is not marked unverified. */
export function isVerifiedSource(source: string): boolean {
  return !source.includes(NOT_VERIFIED);
}

/** Every shipped source string, in a stable order. */
export function shippedSources(): ShippedSource[] {
  const out: ShippedSource[] = [];
  for (const m of Object.values(MATERIALS)) {
    out.push(
      { kind: 'material', id: m.id, field: 'dimensions', label: m.label, source: m.dimensionSource, verified: !m.unverified.includes('dimensions') },
      { kind: 'material', id: m.id, field: 'roughness', label: m.label, source: m.roughnessSource, verified: !m.unverified.includes('roughness') },
      {
        kind: 'material',
        id: m.id,
        field: 'hazenWilliamsC',
        label: m.label,
        source: m.hazenWilliamsSource,
        verified: !m.unverified.includes('hazenWilliamsC'),
      },
    );
  }
  for (const f of Object.values(FIXTURE_TYPES)) {
    out.push({ kind: 'fixture-type', id: f.id, field: 'source', label: `${f.label} (${f.occupancy})`, source: f.source, verified: f.verified });
  }
  for (const f of Object.values(FITTING_TYPES)) {
    for (const line of f.sources) {
      const method = line.slice(0, Math.max(0, line.indexOf(':'))) || 'source';
      out.push({ kind: 'fitting-type', id: f.id, field: method, label: f.label, source: line, verified: isVerifiedSource(line) });
    }
  }
  for (const d of DEVICE_TEMPLATES) {
    out.push({ kind: 'device-template', id: d.id, field: 'points', label: d.label, source: d.source, verified: d.verified });
  }
  out.push({
    kind: 'demand-table',
    id: 'hunter-table-ipc',
    field: 'rows',
    label: 'Fixture units to design flow (table for estimating demand)',
    source: HUNTER_TABLE_IPC_SOURCE,
    verified: HUNTER_TABLE_IPC_VERIFIED,
  });
  for (const m of Object.values(FRICTION_METHODS)) {
    out.push({ kind: 'friction-method', id: m.id, field: 'source', label: m.label, source: m.source, verified: isVerifiedSource(m.source) });
  }
  for (const m of Object.values(FITTING_METHODS)) {
    out.push({ kind: 'fitting-method', id: m.id, field: 'source', label: m.label, source: m.source, verified: m.verified });
  }
  for (const m of Object.values(DEMAND_METHODS)) {
    out.push({ kind: 'demand-method', id: m.id, field: 'source', label: m.label, source: m.source, verified: m.verified });
  }
  for (const [key, source] of Object.entries(CRITERIA_SOURCES)) {
    out.push({ kind: 'criteria', id: key, field: 'default', label: key, source, verified: isVerifiedSource(source) });
  }
  for (const v of DEFAULT_CRITERIA.velocityLimits) {
    out.push({
      kind: 'criteria',
      id: `velocity-${v.material}-${v.service}`,
      field: 'maxVelocity',
      label: `velocity limit, ${v.material}, ${v.service}`,
      source: v.source,
      verified: isVerifiedSource(v.source),
    });
  }
  for (const r of PRESSURE_RATING_SOURCES) {
    out.push({ kind: 'pressure-rating', id: r.id, field: 'rating', label: r.label, source: r.source, verified: r.verified });
  }
  return out;
}

/**
 * Every shipped value that could not be checked against a printed source: what screens and the PDF
 * list under "not verified against the printed code — confirm against the adopted edition".
 */
export function unverifiedSources(): ShippedSource[] {
  return shippedSources().filter((s) => !s.verified);
}
