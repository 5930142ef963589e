/** One line of an entry's numbers for the catalog page, in the project's unit system (display only). */
import { fromSI, UNIT_LABELS } from '../../../engine';
import type { UnitSystem } from '../../../engine';
import type { ProjectCatalogEntry } from '../../../shared/api/catalog';
import { fmt } from '../../walk/lib/format';

export function describeEntry(e: ProjectCatalogEntry, sys: UnitSystem): string {
  const u = UNIT_LABELS[sys];
  const dDigits = sys === 'US' ? 3 : 1;
  switch (e.kind) {
    case 'material':
      return `${e.data.velocityClass} velocity limits; roughness ${fmt(fromSI('diameter', e.data.roughnessM, sys), sys === 'US' ? 6 : 4)} ${u.diameter}; C ${fmt(e.data.hazenWilliamsC, 0)}; sizes ${e.data.sizes.map((s) => `${s.key} (inside ${fmt(fromSI('diameter', s.innerDiameterM, sys), dDigits)} ${u.diameter})`).join(', ')}`;
    case 'fitting-type':
      return `K ${fmt(e.data.k, 2)}`;
    case 'fixture-type': {
      const w = e.data.wsfu;
      return `${e.data.occupancy}, ${e.data.demandCurve}; WSFU cold ${w.cold === null ? '—' : fmt(w.cold, 2)}, hot ${w.hot === null ? '—' : fmt(w.hot, 2)}, total ${fmt(w.total, 2)}; needs ${fmt(fromSI('pressure', e.data.minFlowPressurePa, sys), 1)} ${u.pressure} at ${fmt(fromSI('flow', e.data.flowRateM3s, sys), 2)} ${u.flow}`;
    }
    case 'device-template':
      return `${e.data.kind}; ${e.data.points.map((p) => `${fmt(fromSI('flow', p.flowM3s, sys), 2)} ${u.flow} → ${fmt(fromSI('pressure', p.lossPa, sys), 2)} ${u.pressure}`).join('; ')}`;
  }
}
