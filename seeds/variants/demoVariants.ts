/**
 * The demo's design variants (invented "Alder & Finch" scenario, Wrenmoor), as documents the demo
 * seed stores through the same services a designer uses:
 *  - the cold system sized by Headroom's automatic sizing, with the basis it records when applied;
 *  - a zoned tall building beside it, made by the riser builder: a low zone through a PRV, a middle
 *    zone straight from the supply and a high zone through a variable-speed booster (invented
 *    figures), its pipes then sized by the same sizing;
 *  - the hot system fed from the cold one (its supply read from the cold system's analysis at the
 *    node feeding the water heater, never copied by hand).
 * Not a seed file itself (knex reads only the files directly in seeds/).
 */
import fs from 'node:fs';
import { SystemDocumentSchema, sizeSystem, sizingBasisOf, type SystemDocument } from '../../src/engine';
import { apartmentBuildingDocument, apartmentBuildingSpec } from '../../src/engine/building/apartmentBuilding';
import { buildRiser, type GeneratedBuilding } from '../../src/engine/building/riserBuilder';
import { PA_PER_PSI } from '../../src/engine/units';

export const example = (name: string): unknown => JSON.parse(fs.readFileSync(new URL(`../../src/engine/examples/${name}`, import.meta.url), 'utf8'));

/** When the demo's sizing is said to have been applied (an invented date in the scenario). */
const DEMO_SIZED_AT = new Date('2026-11-24T15:30:00Z');
/** The margin the demo designer asks the sizing to keep at every fixture, psi (an invented design choice). */
const DEMO_MARGIN_PSI = 2;

/** A document sized by Headroom's sizing with the basis recorded, as "Apply to draft" leaves it. */
export function sizedVariant(doc: SystemDocument, marginPsi = DEMO_MARGIN_PSI): SystemDocument {
  const marginPa = marginPsi * PA_PER_PSI;
  const result = sizeSystem(doc, { marginPa });
  if (!result.feasible || !result.document)
    throw new Error(`the demo variant "${doc.name}" cannot be sized (short by ${(result.shortfallPa / PA_PER_PSI).toFixed(2)} psi)`);
  const sized = result.document;
  return { ...sized, sizingBasis: sizingBasisOf({ sized, result, marginPa, scope: 'system', at: DEMO_SIZED_AT }) };
}

/** The demo cold system, sized. */
export function sizedColdDocument(): SystemDocument {
  const cold = SystemDocumentSchema.parse(example('alder-finch-cold.json'));
  return sizedVariant({ ...cold, id: 'alder-finch-cold-sized', name: `${cold.name}, sized by Headroom` });
}

function zoneDevice(d: GeneratedBuilding['devices'][number]): SystemDocument['devices'][number] {
  // the builder's PRVs and boosters carry no loss of their own until the product's data are entered (fixed 0)
  const base = { id: d.id, label: d.label, segmentId: d.segmentId, loss: { kind: 'fixed' as const, loss: 0 } };
  return d.kind === 'prv'
    ? { ...base, kind: 'prv', prv: { setPressure: d.setPressure, falloffPerFlow: 0 } }
    : { ...base, kind: 'booster-pump', boost: { control: 'variable-speed', setPressure: d.setPressure } };
}

/** The PEX insert fitting type for each metal elbow and tee type (the fitting catalog's PEX lines). */
const PEX_TYPE: Record<string, string> = {
  'elbow-90-standard': 'pex-insert-brass-elbow-90',
  'tee-run': 'pex-insert-brass-tee-run',
  'tee-branch': 'pex-insert-brass-tee-branch',
};

/** Storeys of the zoned tall building (an invented study beside the demo building). */
export const TOWER_STOREYS = 16;

/**
 * The zoned tall building: 16 storeys of four apartments, a high-pressure main (100 psi low,
 * 102 psi high: invented figures of the scenario's utility letter); Level 1–5 through a PRV set at
 * 70 psi, Level 6–8 from the supply, Level 9–16 through a variable-speed booster holding
 * 116 psi (invented design figures). Sized by Headroom's sizing, so its service and risers carry
 * the flow of 64 apartments within the velocity limits.
 */
export function zonedTowerDocument(): SystemDocument {
  const base = apartmentBuildingDocument(TOWER_STOREYS);
  const spec = apartmentBuildingSpec(TOWER_STOREYS);
  const f = spec.floors;
  spec.zones = [
    { fromFloor: f[0].id, toFloor: f[4].id, feed: 'prv', setPressure: 70 },
    { fromFloor: f[5].id, toFloor: f[7].id, feed: 'supply' },
    { fromFloor: f[8].id, toFloor: f[TOWER_STOREYS - 1].id, feed: 'booster-pump', setPressure: 116 },
  ];
  // the typical apartment with the PEX fitting types its PEX piping takes, and its water closet
  // line at 3/4 in (at 1/2 in its flow runs above the velocity limit)
  const unitType = {
    ...spec.unitTypes[0],
    segments: spec.unitTypes[0].segments.map((s) => ({
      ...s,
      ...(s.id === 'to-wc' ? { size: '3/4' } : {}),
      fittings: (s.fittings ?? []).map((f) => ({ ...f, typeId: PEX_TYPE[f.typeId] ?? f.typeId })),
    })),
  };
  spec.unitTypes = [unitType];
  const built = buildRiser(spec);
  const startNodes = base.nodes.filter((n) => 'elevation' in n);
  const serviceSegments = base.segments.filter((s) => ['service', 'meter-set', 'backflow-set'].includes(s.id));
  const doc = SystemDocumentSchema.parse({
    ...base,
    id: 'wrenmoor-tower-zoned',
    name: `Quarry Lane tower study, ${TOWER_STOREYS} storeys in three pressure zones (invented)`,
    source: {
      ...base.source,
      staticPressureLow: 100,
      staticPressureHigh: 102,
      pressureBasis: 'Wrenmoor Water Department letter for the high-pressure main on Quarry Lane (invented demo figures)',
    },
    floors: built.floors,
    nodes: [...startNodes, ...built.nodes],
    segments: [...serviceSegments, ...built.segments],
    devices: [...base.devices, ...built.devices.map(zoneDevice)],
    unitTypes: [unitType],
    placements: built.placements,
  });
  return sizedVariant(doc, 1);
}

/** The demo hot system, its supply fed from the cold system's node that feeds the water heater. */
export function hotFedFromColdDocument(coldSystemId: string): SystemDocument {
  const hot = SystemDocumentSchema.parse(example('alder-finch-hot.json'));
  return {
    ...hot,
    id: 'alder-finch-hot-fed',
    name: `${hot.name}, fed from the cold system`,
    source: { ...hot.source, fedFrom: { systemId: coldSystemId, nodeId: 'heater-feed' } },
  };
}
