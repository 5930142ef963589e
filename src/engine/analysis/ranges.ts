/**
 * Validation of magnitudes: every numeric input of a parsed document against its plausible range
 * (model/limits.ts), in the document's own unit system. The first value out of range becomes
 * `value-out-of-range` naming the element and field, with every such value in `issues` (at most
 * MAX_RANGE_ISSUES, and a count of the rest). Runs before any arithmetic, so a 1e308 ft length
 * never reaches the hydraulics.
 */
import { EngineInputError, type ElementType, type EngineIssue } from '../errors';
import { checkRange, type LimitQuantity } from '../model/limits';
import type { SystemDocument } from '../model/schema';

/** Enough to show every slip of a hand-entered document; more only repeats one mistake. */
export const MAX_RANGE_ISSUES = 100;

export function checkRanges(doc: SystemDocument): void {
  const sys = doc.unitSystem;
  const issues: EngineIssue[] = [];
  let more = 0;
  const check = (
    q: LimitQuantity,
    value: number | undefined,
    elementType: ElementType,
    elementId: string | null,
    field: string,
    at: (string | number)[],
    ...tail: (string | number)[]
  ): void => {
    if (value === undefined) return;
    const problem = checkRange(q, value, sys);
    if (problem === null) return;
    // The path is built only for a value out of range (most documents have none).
    const path = [...at, ...tail];
    if (issues.length >= MAX_RANGE_ISSUES) {
      more++;
      return;
    }
    const name = elementId === null ? undefined : labelOf(doc, elementType, elementId);
    const where = elementId ? `${elementType} "${name ?? elementId}"` : elementType;
    issues.push({ code: 'value-out-of-range', elementType, elementId, field, path, message: `${where}, field "${field}": ${value} — ${problem}` });
  };

  check('waterTemperature', doc.waterTemperature, 'system', doc.id, 'waterTemperature', ['waterTemperature']);
  const src = doc.source;
  check('staticPressure', src.staticPressureLow, 'source', src.nodeId, 'staticPressureLow', ['source', 'staticPressureLow']);
  check('staticPressure', src.staticPressureHigh, 'source', src.nodeId, 'staticPressureHigh', ['source', 'staticPressureHigh']);
  if (src.flowTest) {
    const ft = src.flowTest;
    check('staticPressure', ft.staticPressure, 'source', src.nodeId, 'flowTest.staticPressure', ['source', 'flowTest', 'staticPressure']);
    check('staticPressure', ft.residualPressure, 'source', src.nodeId, 'flowTest.residualPressure', ['source', 'flowTest', 'residualPressure']);
    check('flow', ft.flow, 'source', src.nodeId, 'flowTest.flow', ['source', 'flowTest', 'flow']);
  }

  doc.devices.forEach((d, i) => {
    const at = ['devices', i];
    if (d.loss.kind === 'fixed') check('pressureLoss', d.loss.loss, 'device', d.id, 'loss.loss', at, 'loss', 'loss');
    else {
      d.loss.points.forEach((p, k) => {
        check('flow', p.flow, 'device', d.id, `loss.points[${k}].flow`, at, 'loss', 'points', k, 'flow');
        check('pressureLoss', p.loss, 'device', d.id, `loss.points[${k}].loss`, at, 'loss', 'points', k, 'loss');
      });
    }
    if (d.prv) {
      check('pressureSetting', d.prv.setPressure, 'device', d.id, 'prv.setPressure', at, 'prv', 'setPressure');
      check('pressureFalloff', d.prv.falloffPerFlow, 'device', d.id, 'prv.falloffPerFlow', at, 'prv', 'falloffPerFlow');
    }
    const b = d.boost;
    if (b) {
      if ('gain' in b) check('pressureGain', b.gain, 'device', d.id, 'boost.gain', at, 'boost', 'gain');
      else if (b.control === 'constant-speed') {
        check('pressureGain', b.designGain, 'device', d.id, 'boost.designGain', at, 'boost', 'designGain');
        check('pressureGain', b.shutoffGain, 'device', d.id, 'boost.shutoffGain', at, 'boost', 'shutoffGain');
        check('flow', b.designFlow, 'device', d.id, 'boost.designFlow', at, 'boost', 'designFlow');
      } else {
        check('pressureSetting', b.setPressure, 'device', d.id, 'boost.setPressure', at, 'boost', 'setPressure');
      }
    }
  });

  doc.floors.forEach((f, i) => check('elevation', f.elevation, 'floor', f.id, 'elevation', ['floors', i, 'elevation']));

  doc.nodes.forEach((n, i) => {
    const at = ['nodes', i];
    check('elevation', n.elevation, 'node', n.id, 'elevation', at, 'elevation');
    check('heightAboveFloor', n.heightAboveFloor, 'node', n.id, 'heightAboveFloor', at, 'heightAboveFloor');
    check('flow', n.continuousDemand, 'node', n.id, 'continuousDemand', at, 'continuousDemand');
    n.fixtureGroups.forEach((g, k) => {
      const gAt = [...at, 'fixtureGroups', k];
      check('fixtureCount', g.count, 'fixture-group', n.id, 'count', gAt, 'count');
      if (g.custom) {
        check('fixtureUnits', g.custom.wsfuCold, 'fixture-group', n.id, 'custom.wsfuCold', gAt, 'custom', 'wsfuCold');
        check('fixtureUnits', g.custom.wsfuHot, 'fixture-group', n.id, 'custom.wsfuHot', gAt, 'custom', 'wsfuHot');
        check('fixtureUnits', g.custom.wsfuTotal, 'fixture-group', n.id, 'custom.wsfuTotal', gAt, 'custom', 'wsfuTotal');
      }
      if (g.usage) {
        check('fixtureFlow', g.usage.flow, 'fixture-group', n.id, 'usage.flow', gAt, 'usage', 'flow');
        check('useDuration', g.usage.durationSeconds, 'fixture-group', n.id, 'usage.durationSeconds', gAt, 'usage', 'durationSeconds');
        check('useInterval', g.usage.recurrenceSeconds, 'fixture-group', n.id, 'usage.recurrenceSeconds', gAt, 'usage', 'recurrenceSeconds');
      }
    });
    n.checkedFixtures.forEach((f, k) => {
      const fAt = [...at, 'checkedFixtures', k];
      check('minFlowPressure', f.minFlowPressure, 'checked-fixture', f.id, 'minFlowPressure', fAt, 'minFlowPressure');
      check('fixtureFlow', f.flowRate, 'checked-fixture', f.id, 'flowRate', fAt, 'flowRate');
    });
  });

  doc.segments.forEach((s, i) => {
    const at = ['segments', i];
    check('length', s.length, 'segment', s.id, 'length', at, 'length');
    check('rise', s.rise, 'segment', s.id, 'rise', at, 'rise');
    check('flow', s.flowOverride, 'segment', s.id, 'flowOverride', at, 'flowOverride');
    if (s.custom) {
      check('innerDiameter', s.custom.innerDiameter, 'segment', s.id, 'custom.innerDiameter', at, 'custom', 'innerDiameter');
      check('roughness', s.custom.roughness, 'segment', s.id, 'custom.roughness', at, 'custom', 'roughness');
      check('hazenWilliamsC', s.custom.hazenWilliamsC, 'segment', s.id, 'custom.hazenWilliamsC', at, 'custom', 'hazenWilliamsC');
    }
    s.fittings.forEach((f, k) => {
      const fAt = [...at, 'fittings', k];
      check('fittingCount', f.count, 'fitting', s.id, 'count', fAt, 'count');
      if (f.custom && 'k' in f.custom) check('lossCoefficient', f.custom.k, 'fitting', s.id, 'custom.k', fAt, 'custom', 'k');
      if (f.custom && 'equivalentLength' in f.custom) {
        check('equivalentLength', f.custom.equivalentLength, 'fitting', s.id, 'custom.equivalentLength', fAt, 'custom', 'equivalentLength');
      }
    });
  });

  const c = doc.criteria;
  if (c) {
    check('staticPressure', c.maxStaticPressure, 'criteria', null, 'maxStaticPressure', ['criteria', 'maxStaticPressure']);
    check('staticPressure', c.minStaticPressure, 'criteria', null, 'minStaticPressure', ['criteria', 'minStaticPressure']);
    c.velocityLimits?.forEach((v, k) => check('velocityLimit', v.maxVelocity, 'criteria', null, `velocityLimits[${k}].maxVelocity`, ['criteria', 'velocityLimits', k, 'maxVelocity']));
    for (const [typeId, v] of Object.entries(c.minFlowPressures ?? {})) {
      check('minFlowPressure', v, 'criteria', null, `minFlowPressures.${typeId}`, ['criteria', 'minFlowPressures', typeId]);
    }
  }

  if (issues.length > 0) {
    const first = issues[0];
    const extra = more > 0 ? ` (${issues.length + more} values out of range; the first ${issues.length} are listed)` : '';
    throw new EngineInputError({
      code: 'value-out-of-range',
      elementType: first.elementType,
      elementId: first.elementId,
      field: first.field,
      message: first.message + extra,
      issues,
    });
  }
}

/** The name the user typed for an element, for the message (the id stays in elementId). */
function labelOf(doc: SystemDocument, elementType: ElementType, elementId: string): string | undefined {
  switch (elementType) {
    case 'segment':
    case 'fitting':
      return doc.segments.find((s) => s.id === elementId)?.label || undefined;
    case 'node':
    case 'fixture-group':
      return doc.nodes.find((n) => n.id === elementId)?.label || undefined;
    case 'device':
      return doc.devices.find((d) => d.id === elementId)?.label || undefined;
    case 'floor':
      return doc.floors.find((f) => f.id === elementId)?.name || undefined;
    case 'checked-fixture':
      for (const n of doc.nodes) for (const f of n.checkedFixtures) if (f.id === elementId) return f.label || undefined;
      return undefined;
    default:
      return undefined;
  }
}
