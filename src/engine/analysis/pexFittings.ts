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
  const seg = model.seg;
  for (let s = 0; s < seg.count; s++) {
    const materialId = seg.materialId[s];
    if (materialId === null || !PEX_MATERIALS.has(materialId)) continue;
    const fittings = seg.fittings[s];
    const own = seg.customFittings[s];
    let found = false;
    for (let i = 0; i < fittings.length; i++) {
      if (own !== null && own[i] !== null) continue;
      const typeId = fittings[i].typeId;
      const entry = Object.prototype.hasOwnProperty.call(FITTING_TYPES, typeId) ? FITTING_TYPES[typeId] : undefined;
      if (entry?.pipeFamily !== 'metal') continue;
      found = true;
      if (!types.includes(entry.label)) types.push(entry.label);
    }
    if (found) {
      ids.push(seg.id[s]);
      names.push(seg.label[s] ?? seg.id[s]);
    }
  }
  if (ids.length === 0) return;
  const shown = names.slice(0, NAMED_IN_DETAIL).join(', ');
  const more = names.length > NAMED_IN_DETAIL ? ` and ${names.length - NAMED_IN_DETAIL} more` : '';
  warnings.push(makeGroupedWarning('pex-metal-fittings', 'segment', ids, `${shown}${more}: ${types.join('; ')}`));
}
