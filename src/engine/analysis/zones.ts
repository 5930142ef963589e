/**
 * Post-pass: pressure zones. A zone is the part of a system fed through one PRV or booster pump at
 * its own set pressure (DESIGN.md "Zone"); the first zone is the part fed straight from the supply.
 * The zone of a node is the zone of its feed segment's upstream node, unless that segment carries a
 * PRV or a booster at its inlet: then the segment and everything downstream of it form a new zone
 * (nested zones allowed — a PRV below a booster opens a zone inside the booster's). Several such
 * devices on one segment open one zone each, in list order; only the last holds nodes.
 *
 * Per zone this pass only gathers what the earlier stages computed (hydraulics, checks): the
 * feeding device and its set pressure, the floors and elevations it spans, its highest and lowest
 * residual pressure at design flow and where, its highest static pressure (the static check against
 * the criteria's maximum, at the nodes that serve fixtures, as checks.ts does it), its critical
 * fixture and margin, its checked fixtures and its verdict. Nothing is recomputed.
 *
 * A PRV without a set pressure never reaches this pass: input.ts refuses it (error `missing-field`,
 * naming the device and its `prv` field).
 */
import { fromSI, UNIT_LABELS } from '../units';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { HydraulicsResult } from './hydraulics';
import type { ChecksResult } from './checks';
import type { IncompleteReason, ZoneResult } from './types';
import { nodeName } from './names';

interface ZoneBuild {
  id: string;
  parent: number;
  kind: ZoneResult['feed']['kind'];
  deviceId: string | null;
  deviceLabel: string | null;
  segIdx: number;
  /** Set pressure (PRV, variable-speed booster) or design gain (constant-speed booster), Pa; null for the supply. */
  settingPa: number | null;
  settingKind: ZoneResult['feed']['setting'];
}

/** The zone index of every node (−1 where the source does not reach) and the zones, in tree order. */
export function assignZones(model: SiModel, topo: Topology): { zones: ZoneBuild[]; nodeZone: Int32Array; segZone: Int32Array } {
  const zones: ZoneBuild[] = [{ id: 'supply', parent: -1, kind: 'supply', deviceId: null, deviceLabel: null, segIdx: -1, settingPa: null, settingKind: null }];
  const nodeZone = new Int32Array(model.nodeIds.length).fill(-1);
  const segZone = new Int32Array(model.seg.count).fill(-1);
  nodeZone[model.source.nodeIdx] = 0;
  for (let k = 0; k < topo.order.length; k++) {
    const s = topo.order[k];
    let z = nodeZone[model.seg.from[s]];
    const devs = model.devicesBySeg[s];
    for (let j = 0; j < devs.length; j++) {
      const d = devs[j];
      if (d.prv) {
        zones.push({ id: d.id, parent: z, kind: 'prv', deviceId: d.id, deviceLabel: d.label, segIdx: s, settingPa: d.prv.setPa, settingKind: 'set' });
        z = zones.length - 1;
      } else if (d.boost) {
        const vs = d.boost.control === 'variable-speed';
        zones.push({
          id: d.id,
          parent: z,
          kind: 'booster-pump',
          deviceId: d.id,
          deviceLabel: d.label,
          segIdx: s,
          settingPa: d.boost.control === 'variable-speed' ? d.boost.setPa : d.boost.designPa,
          settingKind: vs ? 'set' : 'gain',
        });
        z = zones.length - 1;
      }
    }
    segZone[s] = z;
    nodeZone[model.seg.to[s]] = z;
  }
  return { zones, nodeZone, segZone };
}

interface At {
  pa: number;
  node: number;
}

export function computeZones(model: SiModel, topo: Topology, hyd: HydraulicsResult, checks: ChecksResult, incomplete: IncompleteReason[]): ZoneResult[] {
  const sys = model.unitSystem;
  const p = (pa: number) => fromSI('pressure', pa, sys);
  const zUnit = (m: number) => fromSI('elevation', m, sys);
  const { zones, nodeZone, segZone } = assignZones(model, topo);
  const n = zones.length;

  const highest: (At | null)[] = new Array(n).fill(null);
  const lowest: (At | null)[] = new Array(n).fill(null);
  const staticHigh: (At | null)[] = new Array(n).fill(null);
  const staticFail = new Int32Array(n);
  const minZ = new Float64Array(n).fill(Infinity);
  const maxZ = new Float64Array(n).fill(-Infinity);
  const nodeCount = new Int32Array(n);
  const groupCount = new Int32Array(n);
  // Floors and elevations of the nodes that serve fixtures (what the zone serves); of every node
  // where a zone serves none (a base node beside the start, a heater feed).
  const floorIds: Set<string>[] = Array.from({ length: n }, () => new Set());
  const allFloorIds: Set<string>[] = Array.from({ length: n }, () => new Set());
  const minZAll = new Float64Array(n).fill(Infinity);
  const maxZAll = new Float64Array(n).fill(-Infinity);

  for (let i = 0; i < model.nodeIds.length; i++) {
    const z = nodeZone[i];
    if (z === -1) continue;
    nodeCount[z]++;
    groupCount[z] += model.doc.nodes[i].fixtureGroups.length;
    const pa = hyd.nodePressurePa[i];
    if (highest[z] === null || pa > highest[z]!.pa) highest[z] = { pa, node: i };
    if (lowest[z] === null || pa < lowest[z]!.pa) lowest[z] = { pa, node: i };
    const elev = model.elevationM[i];
    const floor = model.doc.nodes[i].floor;
    if (elev < minZAll[z]) minZAll[z] = elev;
    if (elev > maxZAll[z]) maxZAll[z] = elev;
    if (floor !== undefined) allFloorIds[z].add(floor);
    if (model.servesFixtures[i] === 1) {
      if (elev < minZ[z]) minZ[z] = elev;
      if (elev > maxZ[z]) maxZ[z] = elev;
      if (floor !== undefined) floorIds[z].add(floor);
    }
    // The static check applies where fixtures are served (checks.ts: nodeStaticPass is null elsewhere).
    const pass = checks.nodeStaticPass[i];
    if (pass === null || pass === undefined) continue;
    const st = hyd.nodeStaticHighPa[i];
    if (staticHigh[z] === null || st > staticHigh[z]!.pa) staticHigh[z] = { pa: st, node: i };
    if (!pass) staticFail[z]++;
  }

  const segCount = new Int32Array(n);
  const velocityFail = new Int32Array(n);
  for (let s = 0; s < model.seg.count; s++) {
    const z = segZone[s];
    if (z === -1) continue;
    segCount[z]++;
    if (checks.velocityPass[s] === false) velocityFail[z]++;
  }

  const fixtureCount = new Int32Array(n);
  const fixtureFail = new Int32Array(n);
  const critical = new Int32Array(n).fill(-1);
  for (const c of checks.fixtures) {
    const z = nodeZone[model.fixtures[c.index].nodeIdx];
    if (z === -1) continue;
    fixtureCount[z]++;
    if (!c.pass) fixtureFail[z]++;
    if (critical[z] === -1 || c.marginPa < checks.fixtures[critical[z]].marginPa) critical[z] = c.index;
  }

  // Incomplete reasons, by the zone of their element; a reason whose element has no place in the
  // tree (the system, the source, an unreached part, a fitting) counts against every zone: never a
  // green zone on an incomplete description.
  const reasonsByZone: string[][] = Array.from({ length: n }, () => []);
  const deviceSeg = new Map<string, number>();
  for (const d of model.devicesInSegmentOrder) deviceSeg.set(d.id, d.segIdx);
  const fixtureNode = new Map<string, number>();
  for (const f of model.fixtures) fixtureNode.set(f.id, f.nodeIdx);
  for (const r of incomplete) {
    let z = -1;
    const id = r.elementId;
    if (id !== null) {
      if (r.elementType === 'node') z = nodeZone[model.nodeIndex.get(id) ?? -1] ?? -1;
      else if (r.elementType === 'segment') z = segZone[model.segIndex.get(id) ?? -1] ?? -1;
      else if (r.elementType === 'checked-fixture') z = nodeZone[fixtureNode.get(id) ?? -1] ?? -1;
      else if (r.elementType === 'device') z = segZone[deviceSeg.get(id) ?? -1] ?? -1;
    }
    if (z >= 0) reasonsByZone[z].push(r.message);
    else for (const list of reasonsByZone) list.push(r.message);
  }

  const floorOrder = new Map(model.doc.floors.map((f, k) => [f.id, { name: f.name, elevation: f.elevation, k }]));
  // each floor's rank from the lowest (document order breaks a tie), keyed by its document index
  const floorRank = new Map([...floorOrder.values()].sort((a, b) => a.elevation - b.elevation || a.k - b.k).map((f, rank) => [f.k, rank] as const));
  const where = (i: number) => model.nodeLabels[i] ?? nodeName(model, i).replace(/^"|"$/g, '');
  const pressureUnit = UNIT_LABELS[sys].pressure;
  const maxStatic = model.criteria.maxStaticPressurePa;

  return zones.map((zb, z) => {
    const setting = zb.settingPa === null ? null : p(zb.settingPa);
    const index = z + 1;
    const name =
      zb.kind === 'supply'
        ? `Zone ${index} — from the supply`
        : `Zone ${index} — ${zb.deviceLabel} (${zb.settingKind === 'set' ? 'set' : 'gain'} ${formatSetting(setting!, sys)} ${pressureUnit})`;
    const served = minZ[z] !== Infinity;
    const zoneFloors = [...(served ? floorIds[z] : allFloorIds[z])]
      .map((id) => floorOrder.get(id))
      .filter((f) => f !== undefined)
      .sort((a, b) => a.elevation - b.elevation || a.k - b.k);
    const floors = zoneFloors.map((f) => f.name);
    // Runs of adjacent floors (adjacent among all the document's floors), so that a zone serving
    // Level 1 and Levels 5–7 is not written as if it spanned Levels 1–7.
    const floorRuns: ZoneResult['floorRuns'] = [];
    let previous = -2;
    for (const f of zoneFloors) {
      const at = floorRank.get(f.k)!;
      const run = floorRuns[floorRuns.length - 1];
      if (run && at === previous + 1) {
        run.to = f.name;
        run.count += 1;
      } else floorRuns.push({ from: f.name, to: f.name, count: 1 });
      previous = at;
    }
    const crit = critical[z] === -1 ? null : checks.fixtures[critical[z]];
    const hi = highest[z];
    const lo = lowest[z];
    const st = staticHigh[z];
    const failures = fixtureFail[z] + velocityFail[z] + staticFail[z];
    const reasons = [...reasonsByZone[z]];
    // No checked fixture in the zone (a PRV on a water heater's feed, whose fixtures the hot system
    // checks): nothing is compared with a minimum here, so the zone is never shown as passing; its
    // static and velocity checks still fail it. The system's own verdict rule (report.ts) is unchanged.
    const status: ZoneResult['status'] = reasons.length > 0 ? 'incomplete' : failures > 0 ? 'fail' : fixtureCount[z] === 0 ? 'not-checked' : 'pass';
    const entry = zb.segIdx === -1 ? null : { id: model.seg.id[zb.segIdx], from: model.seg.from[zb.segIdx] };
    return {
      id: zb.id,
      index,
      name,
      parentZoneId: zb.parent === -1 ? null : zones[zb.parent].id,
      feed: {
        kind: zb.kind,
        deviceId: zb.deviceId,
        deviceLabel: zb.deviceLabel,
        setting: zb.settingKind,
        pressure: setting,
      },
      entrySegmentId: entry === null ? null : entry.id,
      entryNodeId: entry === null ? model.nodeIds[model.source.nodeIdx] : model.nodeIds[entry.from],
      floors,
      floorRuns,
      lowestElevation: nodeCount[z] === 0 ? null : zUnit(served ? minZ[z] : minZAll[z]),
      highestElevation: nodeCount[z] === 0 ? null : zUnit(served ? maxZ[z] : maxZAll[z]),
      nodeCount: nodeCount[z],
      segmentCount: segCount[z],
      highestResidual: hi === null ? null : { pressure: p(hi.pa), nodeId: model.nodeIds[hi.node], where: where(hi.node) },
      lowestResidual: lo === null ? null : { pressure: p(lo.pa), nodeId: model.nodeIds[lo.node], where: where(lo.node) },
      highestStatic:
        st === null ? null : { pressure: p(st.pa), nodeId: model.nodeIds[st.node], where: where(st.node), maximum: p(maxStatic), pass: staticFail[z] === 0 },
      criticalFixture:
        crit === null
          ? null
          : {
              fixtureId: model.fixtures[crit.index].id,
              label: model.fixtures[crit.index].label,
              residual: p(crit.residualPa),
              required: p(model.fixtures[crit.index].requiredPa),
              margin: p(crit.marginPa),
              pass: crit.pass,
            },
      checkedFixtures: fixtureCount[z],
      fixtureGroups: groupCount[z],
      failingFixtures: fixtureFail[z],
      velocityFailures: velocityFail[z],
      staticFailures: staticFail[z],
      status,
      incomplete: reasons,
    };
  });
}

/** A set pressure as typed: whole numbers without decimals (65 psi), else as the ledger rounds (2 / 1 decimals). */
function formatSetting(v: number, sys: 'US' | 'SI'): string {
  const rounded = Math.round(v);
  if (Math.abs(v - rounded) < 1e-6 * Math.max(1, Math.abs(v))) return String(rounded);
  return v.toFixed(sys === 'US' ? 2 : 1);
}
