/**
 * Validation of magnitudes: every numeric input of a parsed document against its plausible range
 * (model/limits.ts), in the document's own unit system. The first value out of range becomes
 * `value-out-of-range` naming the element and field, with every such value in `issues` (at most
 * MAX_RANGE_ISSUES, and a count of the rest). Runs before any arithmetic, so a 1e308 ft length
 * never reaches the hydraulics.
 */
import { EngineInputError, type ElementType, type EngineIssue } from '../errors';
import { checkRange, LIMITS, type LimitQuantity } from '../model/limits';
import type { SystemDocument } from '../model/schema';
import type { UnitSystem } from '../units';

/** Enough to show every slip of a hand-entered document; more only repeats one mistake. */
export const MAX_RANGE_ISSUES = 100;

/** One quantity's limits in one unit system, flattened for the per-value test (LIMITS is frozen). */
interface Bound {
  quantity: LimitQuantity;
  min: number;
  max: number;
  minExclusive: boolean;
  integer: boolean;
}

const BOUNDS: Partial<Record<UnitSystem, Record<LimitQuantity, Bound>>> = {};

function boundsFor(sys: UnitSystem): Record<LimitQuantity, Bound> {
  let b = BOUNDS[sys];
  if (b === undefined) {
    b = {} as Record<LimitQuantity, Bound>;
    for (const quantity of Object.keys(LIMITS) as LimitQuantity[]) {
      const lim = LIMITS[quantity];
      b[quantity] = { quantity, min: lim[sys].min, max: lim[sys].max, minExclusive: lim.minExclusive, integer: lim.integer };
    }
    BOUNDS[sys] = b;
  }
  return b;
}

/**
 * True exactly when checkRange (model/limits.ts) finds nothing to say: the same tests, without its
 * lookup by name, so the common case (every value in range) allocates nothing.
 */
function inRange(b: Bound, value: number): boolean {
  return Number.isFinite(value) && (!b.integer || Number.isInteger(value)) && (b.minExclusive ? value > b.min : value >= b.min) && value <= b.max;
}

export function checkRanges(doc: SystemDocument): void {
  const sys = doc.unitSystem;
  const B = boundsFor(sys);
  const issues: EngineIssue[] = [];
  let more = 0;
  /**
   * The value's check; its path is given as up to six parts (p0 … p5) rather than an array, and
   * the array is built only for a value out of range (most documents have none).
   */
  const check = (
    b: Bound,
    value: number | undefined,
    elementType: ElementType,
    elementId: string | null,
    field: string,
    p0: string,
    p1?: string | number,
    p2?: string | number,
    p3?: string | number,
    p4?: string | number,
    p5?: string | number,
  ): void => {
    if (value === undefined || inRange(b, value)) return;
    const problem = checkRange(b.quantity, value, sys);
    if (problem === null) return;
    const path: (string | number)[] = [p0];
    for (const p of [p1, p2, p3, p4, p5]) if (p !== undefined) path.push(p);
    if (issues.length >= MAX_RANGE_ISSUES) {
      more++;
      return;
    }
    const name = elementId === null ? undefined : labelOf(doc, elementType, elementId);
    const where = elementId ? `${elementType} "${name ?? elementId}"` : elementType;
    issues.push({ code: 'value-out-of-range', elementType, elementId, field, path, message: `${where}, field "${field}": ${value} — ${problem}` });
  };

  check(B.waterTemperature, doc.waterTemperature, 'system', doc.id, 'waterTemperature', 'waterTemperature');
  const src = doc.source;
  check(B.staticPressure, src.staticPressureLow, 'source', src.nodeId, 'staticPressureLow', 'source', 'staticPressureLow');
  check(B.staticPressure, src.staticPressureHigh, 'source', src.nodeId, 'staticPressureHigh', 'source', 'staticPressureHigh');
  if (src.flowTest) {
    const ft = src.flowTest;
    check(B.staticPressure, ft.staticPressure, 'source', src.nodeId, 'flowTest.staticPressure', 'source', 'flowTest', 'staticPressure');
    check(B.staticPressure, ft.residualPressure, 'source', src.nodeId, 'flowTest.residualPressure', 'source', 'flowTest', 'residualPressure');
    check(B.flow, ft.flow, 'source', src.nodeId, 'flowTest.flow', 'source', 'flowTest', 'flow');
  }

  for (let i = 0; i < doc.devices.length; i++) {
    const d = doc.devices[i];
    if (d.loss.kind === 'fixed') check(B.pressureLoss, d.loss.loss, 'device', d.id, 'loss.loss', 'devices', i, 'loss', 'loss');
    else {
      d.loss.points.forEach((p, k) => {
        check(B.flow, p.flow, 'device', d.id, `loss.points[${k}].flow`, 'devices', i, 'loss', 'points', k, 'flow');
        check(B.pressureLoss, p.loss, 'device', d.id, `loss.points[${k}].loss`, 'devices', i, 'loss', 'points', k, 'loss');
      });
    }
    if (d.prv) {
      check(B.pressureSetting, d.prv.setPressure, 'device', d.id, 'prv.setPressure', 'devices', i, 'prv', 'setPressure');
      check(B.pressureFalloff, d.prv.falloffPerFlow, 'device', d.id, 'prv.falloffPerFlow', 'devices', i, 'prv', 'falloffPerFlow');
    }
    const b = d.boost;
    if (b) {
      if ('gain' in b) check(B.pressureGain, b.gain, 'device', d.id, 'boost.gain', 'devices', i, 'boost', 'gain');
      else if (b.control === 'constant-speed') {
        check(B.pressureGain, b.designGain, 'device', d.id, 'boost.designGain', 'devices', i, 'boost', 'designGain');
        check(B.pressureGain, b.shutoffGain, 'device', d.id, 'boost.shutoffGain', 'devices', i, 'boost', 'shutoffGain');
        check(B.flow, b.designFlow, 'device', d.id, 'boost.designFlow', 'devices', i, 'boost', 'designFlow');
      } else {
        check(B.pressureSetting, b.setPressure, 'device', d.id, 'boost.setPressure', 'devices', i, 'boost', 'setPressure');
      }
    }
  }

  for (let i = 0; i < doc.floors.length; i++) {
    const f = doc.floors[i];
    check(B.elevation, f.elevation, 'floor', f.id, 'elevation', 'floors', i, 'elevation');
  }

  for (let i = 0; i < doc.nodes.length; i++) {
    const n = doc.nodes[i];
    check(B.elevation, n.elevation, 'node', n.id, 'elevation', 'nodes', i, 'elevation');
    check(B.heightAboveFloor, n.heightAboveFloor, 'node', n.id, 'heightAboveFloor', 'nodes', i, 'heightAboveFloor');
    check(B.flow, n.continuousDemand, 'node', n.id, 'continuousDemand', 'nodes', i, 'continuousDemand');
    for (let k = 0; k < n.fixtureGroups.length; k++) {
      const g = n.fixtureGroups[k];
      check(B.fixtureCount, g.count, 'fixture-group', n.id, 'count', 'nodes', i, 'fixtureGroups', k, 'count');
      if (g.custom) {
        check(B.fixtureUnits, g.custom.wsfuCold, 'fixture-group', n.id, 'custom.wsfuCold', 'nodes', i, 'fixtureGroups', k, 'custom', 'wsfuCold');
        check(B.fixtureUnits, g.custom.wsfuHot, 'fixture-group', n.id, 'custom.wsfuHot', 'nodes', i, 'fixtureGroups', k, 'custom', 'wsfuHot');
        check(B.fixtureUnits, g.custom.wsfuTotal, 'fixture-group', n.id, 'custom.wsfuTotal', 'nodes', i, 'fixtureGroups', k, 'custom', 'wsfuTotal');
      }
      if (g.usage) {
        check(B.fixtureFlow, g.usage.flow, 'fixture-group', n.id, 'usage.flow', 'nodes', i, 'fixtureGroups', k, 'usage', 'flow');
        check(
          B.useDuration,
          g.usage.durationSeconds,
          'fixture-group',
          n.id,
          'usage.durationSeconds',
          'nodes',
          i,
          'fixtureGroups',
          k,
          'usage',
          'durationSeconds',
        );
        check(
          B.useInterval,
          g.usage.recurrenceSeconds,
          'fixture-group',
          n.id,
          'usage.recurrenceSeconds',
          'nodes',
          i,
          'fixtureGroups',
          k,
          'usage',
          'recurrenceSeconds',
        );
      }
    }
    for (let k = 0; k < n.checkedFixtures.length; k++) {
      const f = n.checkedFixtures[k];
      check(B.minFlowPressure, f.minFlowPressure, 'checked-fixture', f.id, 'minFlowPressure', 'nodes', i, 'checkedFixtures', k, 'minFlowPressure');
      check(B.fixtureFlow, f.flowRate, 'checked-fixture', f.id, 'flowRate', 'nodes', i, 'checkedFixtures', k, 'flowRate');
    }
  }

  for (let i = 0; i < doc.segments.length; i++) {
    const s = doc.segments[i];
    check(B.length, s.length, 'segment', s.id, 'length', 'segments', i, 'length');
    check(B.rise, s.rise, 'segment', s.id, 'rise', 'segments', i, 'rise');
    check(B.flow, s.flowOverride, 'segment', s.id, 'flowOverride', 'segments', i, 'flowOverride');
    if (s.custom) {
      check(B.innerDiameter, s.custom.innerDiameter, 'segment', s.id, 'custom.innerDiameter', 'segments', i, 'custom', 'innerDiameter');
      check(B.roughness, s.custom.roughness, 'segment', s.id, 'custom.roughness', 'segments', i, 'custom', 'roughness');
      check(B.hazenWilliamsC, s.custom.hazenWilliamsC, 'segment', s.id, 'custom.hazenWilliamsC', 'segments', i, 'custom', 'hazenWilliamsC');
    }
    for (let k = 0; k < s.fittings.length; k++) {
      const f = s.fittings[k];
      check(B.fittingCount, f.count, 'fitting', s.id, 'count', 'segments', i, 'fittings', k, 'count');
      if (f.custom && 'k' in f.custom) check(B.lossCoefficient, f.custom.k, 'fitting', s.id, 'custom.k', 'segments', i, 'fittings', k, 'custom', 'k');
      if (f.custom && 'equivalentLength' in f.custom) {
        check(
          B.equivalentLength,
          f.custom.equivalentLength,
          'fitting',
          s.id,
          'custom.equivalentLength',
          'segments',
          i,
          'fittings',
          k,
          'custom',
          'equivalentLength',
        );
      }
    }
  }

  const c = doc.criteria;
  if (c) {
    check(B.staticPressure, c.maxStaticPressure, 'criteria', null, 'maxStaticPressure', 'criteria', 'maxStaticPressure');
    check(B.staticPressure, c.minStaticPressure, 'criteria', null, 'minStaticPressure', 'criteria', 'minStaticPressure');
    c.velocityLimits?.forEach((v, k) =>
      check(B.velocityLimit, v.maxVelocity, 'criteria', null, `velocityLimits[${k}].maxVelocity`, 'criteria', 'velocityLimits', k, 'maxVelocity'),
    );
    for (const [typeId, v] of Object.entries(c.minFlowPressures ?? {})) {
      check(B.minFlowPressure, v, 'criteria', null, `minFlowPressures.${typeId}`, 'criteria', 'minFlowPressures', typeId);
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
