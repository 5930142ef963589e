/**
 * The contractor's sizing on a field change: "the smallest PEX that still passes". The segments
 * the contractor names take another catalog material (PEX by default), each at the smallest of
 * that material's sizes such that every velocity stays within its limit and every checked fixture
 * keeps its minimum flow pressure plus the margin — the same exact search as the designer's
 * sizing (sizeSystem.ts), limited to those segments; every other segment keeps its issued
 * material and size.
 *
 * What a field change may change is the server's policy (server/services/fieldChangeRules.ts): per
 * existing segment its material, size, custom pipe data, length and fittings. This function
 * changes only material and size, so its answer is always a document the policy accepts. A
 * segment the designer locked (`sizeLocked`) keeps its material and size, and a custom pipe is
 * not a catalog pipe: both are reported as skipped, not changed. Fittings are kept as they are:
 * the contractor enters the fittings actually used (press or insert fittings) as for any change.
 */
import type { SystemDocument } from '../model/schema';
import { parseDocument } from '../analysis/input';
import { MATERIALS, type MaterialId } from '../catalog/materials';
import { sizeSystem, SizingError, type SizingResult } from './sizeSystem';

/** The default substitute: PEX, SDR 9, copper tube size (the catalog's PEX). */
export const DEFAULT_SUBSTITUTE_MATERIAL: MaterialId = 'pex-sdr9';

export interface SubstituteOptions {
  /** The segments the contractor substitutes. */
  segmentIds: readonly string[];
  /** The material they take (default PEX SDR 9). */
  material?: string;
  /** Pressure every checked fixture must keep above its minimum, Pa (default 0). */
  marginPa?: number;
}

export interface SubstituteResult {
  material: MaterialId;
  /** The segments that take the material (and whose sizes were chosen). */
  substituted: string[];
  /** Named segments left as issued, with why. */
  skipped: { segmentId: string; reason: 'locked' | 'custom-pipe' }[];
  /** The sizing over the substituted segments; its `document` is the proposed field change (null when no size passes). */
  sizing: SizingResult;
}

export function smallestSubstitute(input: unknown, options: SubstituteOptions): SubstituteResult {
  const doc: SystemDocument = parseDocument(input);
  const materialId = (options.material ?? DEFAULT_SUBSTITUTE_MATERIAL) as MaterialId;
  const material = MATERIALS[materialId];
  if (!material) throw new SizingError('unknown-material', `No material "${options.material}" in the catalog.`);
  const byId = new Map(doc.segments.map((s) => [s.id, s]));
  for (const id of options.segmentIds) {
    if (!byId.has(id)) throw new SizingError('unknown-segment', `No segment "${id}" in the system.`, id);
  }
  const named = new Set(options.segmentIds);
  const skipped: SubstituteResult['skipped'] = [];
  const substituted: string[] = [];
  // Smallest-first by inside diameter: the starting size only has to be a valid size of the material.
  const sizes = [...material.sizes].sort((a, b) => a.innerDiameterM - b.innerDiameterM);
  const segments = doc.segments.map((s) => {
    if (!named.has(s.id)) return s;
    if (s.sizeLocked) {
      skipped.push({ segmentId: s.id, reason: 'locked' });
      return s;
    }
    if (s.custom) {
      skipped.push({ segmentId: s.id, reason: 'custom-pipe' });
      return s;
    }
    substituted.push(s.id);
    const same = sizes.find((z) => z.key === s.size);
    return { ...s, material: material.id, size: (same ?? sizes[sizes.length - 1]).key };
  });
  if (substituted.length === 0) {
    throw new SizingError(
      skipped.length && skipped.every((x) => x.reason === 'locked') ? 'all-locked' : 'nothing-to-size',
      skipped.length && skipped.every((x) => x.reason === 'locked')
        ? 'Every segment named is locked by the designer: nothing can be substituted and nothing was changed.'
        : 'No segment named can take a catalog material: nothing was changed.',
      options.segmentIds[0] ?? null,
    );
  }
  const sizing = sizeSystem({ ...doc, segments }, { segmentIds: substituted, marginPa: options.marginPa });
  return { material: material.id, substituted, skipped, sizing };
}
