/**
 * PEX segments that still carry fittings made for metal pipe (the threaded or soldered elbows, tees
 * and couplings of the metal-pipe tables): after a substitution from copper to PEX the fittings were
 * most likely not changed with the pipe. One grouped caution names every such segment (a building of
 * PEX fixture branches would otherwise repeat it hundreds of times) and the metal fitting types found.
 */
import { FITTING_TYPES } from '../fittings/types';
import { makeGroupedWarning, type EngineWarning } from '../warnings';
import type { SiModel } from './input';

/** Catalog materials that are PEX tubing (materials.ts). */
const PEX_MATERIALS: ReadonlySet<string> = new Set(['pex-sdr9']);
/** Segment names spelled out in the detail; the rest are counted (all are in elementIds). */
const NAMED_IN_DETAIL = 5;

export function pexMetalFittingWarnings(model: SiModel, warnings: EngineWarning[]): void {
  const ids: string[] = [];
  const names: string[] = [];
  const types: string[] = [];
  for (const seg of model.segments) {
    if (seg.materialId === null || !PEX_MATERIALS.has(seg.materialId)) continue;
    let found = false;
    seg.fittings.forEach((fit, i) => {
      if (seg.customFittings !== null && seg.customFittings[i] !== null) return;
      const entry = Object.prototype.hasOwnProperty.call(FITTING_TYPES, fit.typeId) ? FITTING_TYPES[fit.typeId] : undefined;
      if (entry?.pipeFamily !== 'metal') return;
      found = true;
      if (!types.includes(entry.label)) types.push(entry.label);
    });
    if (found) {
      ids.push(seg.id);
      names.push(seg.label ?? seg.id);
    }
  }
  if (ids.length === 0) return;
  const shown = names.slice(0, NAMED_IN_DETAIL).join(', ');
  const more = names.length > NAMED_IN_DETAIL ? ` and ${names.length - NAMED_IN_DETAIL} more` : '';
  warnings.push(makeGroupedWarning('pex-metal-fittings', 'segment', ids, `${shown}${more}: ${types.join('; ')}`));
}
