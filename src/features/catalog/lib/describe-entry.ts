/** One line of an entry's numbers for the catalog page, in the project's unit system (display only). */
import { fromSI, UNIT_LABELS } from '../../../engine';
import type { UnitSystem } from '../../../engine';
import type { ProjectCatalogEntry } from '../../../shared/api/catalog';
import { num } from '../../../shared/format/quantity';

export function describeEntry(e: ProjectCatalogEntry, sys: UnitSystem): string {
  const u = UNIT_LABELS[sys];
  switch (e.kind) {
    case 'material':
      return `${e.data.velocityClass} velocity limits; roughness ${num(fromSI('diameter', e.data.roughnessM, sys), u.diameter, 'roughness')} ${u.diameter}; C ${num(e.data.hazenWilliamsC, 'Hazen–Williams C')}; sizes ${e.data.sizes.map((s) => `${s.key} (inside ${num(fromSI('diameter', s.innerDiameterM, sys), u.diameter)} ${u.diameter})`).join(', ')}`;
    case 'fitting-type':
      return `K ${num(e.data.k, 'loss coefficient')}`;
    case 'fixture-type': {
      const w = e.data.wsfu;
      return `${e.data.occupancy}, ${e.data.demandCurve}; WSFU cold ${w.cold === null ? '—' : num(w.cold, 'WSFU')}, hot ${w.hot === null ? '—' : num(w.hot, 'WSFU')}, total ${num(w.total, 'WSFU')}; needs ${num(fromSI('pressure', e.data.minFlowPressurePa, sys), u.pressure)} ${u.pressure} at ${num(fromSI('flow', e.data.flowRateM3s, sys), u.flow)} ${u.flow}`;
    }
    case 'device-template':
      return `${e.data.kind}; ${e.data.points.map((p) => `${num(fromSI('flow', p.flowM3s, sys), u.flow)} ${u.flow} → ${num(fromSI('pressure', p.lossPa, sys), u.pressure)} ${u.pressure}`).join('; ')}`;
  }
}
