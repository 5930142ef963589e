/**
 * Stage 6: checks. Residual against the minimum flow pressure at every checked fixture (the
 * critical fixture is the smallest margin); velocity against the limit of the material class
 * and service; high static pressure against the maximum at every node that serves fixtures.
 */
import { fromSI } from '../units';
import { makeWarning, type EngineWarning } from '../warnings';
import type { SiModel } from './input';
import type { HydraulicsResult } from './hydraulics';

/** Elevations and developed lengths within 1 mm count as equal when naming the highest/farthest fixture. */
const SAME_PLACE_M = 1e-3;

export interface FixtureCheck {
  index: number;
  residualPa: number;
  marginPa: number;
  pass: boolean;
}

export interface ChecksResult {
  fixtures: FixtureCheck[];
  criticalIndex: number;
  velocityLimitMs: (number | null)[];
  velocityPass: (boolean | null)[];
  nodeStaticPass: (boolean | null)[];
  failures: number;
}

export function runChecks(model: SiModel, hyd: HydraulicsResult, warnings: EngineWarning[]): ChecksResult {
  const sys = model.unitSystem;
  const psys = (pa: number) => `${fromSI('pressure', pa, sys).toFixed(2)} ${sys === 'US' ? 'psi' : 'kPa'}`;
  let failures = 0;

  // Fixtures
  const fixtures: FixtureCheck[] = model.fixtures.map((fx, index) => {
    const residualPa = hyd.nodePressurePa[fx.nodeIdx];
    const marginPa = residualPa - fx.requiredPa;
    return { index, residualPa, marginPa, pass: marginPa >= 0 };
  });
  let criticalIndex = -1;
  for (const c of fixtures) {
    if (!c.pass) {
      failures++;
      const fx = model.fixtures[c.index];
      warnings.push(makeWarning('residual-below-minimum', 'checked-fixture', fx.id, `residual ${psys(c.residualPa)}, needs ${psys(fx.requiredPa)}`));
    }
    if (criticalIndex === -1 || c.marginPa < fixtures[criticalIndex].marginPa) criticalIndex = c.index;
  }
  if (fixtures.length === 0) warnings.push(makeWarning('no-checked-fixtures', 'system', model.doc.id));
  if (criticalIndex !== -1) {
    const crit = model.fixtures[criticalIndex];
    let maxZ = -Infinity;
    let maxL = -Infinity;
    let highest = crit;
    let farthest = crit;
    for (const fx of model.fixtures) {
      const z = model.elevationM[fx.nodeIdx];
      const l = hyd.nodeDevelopedLengthM[fx.nodeIdx];
      if (z > maxZ) {
        maxZ = z;
        highest = fx;
      }
      if (l > maxL) {
        maxL = l;
        farthest = fx;
      }
    }
    if (model.elevationM[crit.nodeIdx] < maxZ - SAME_PLACE_M) {
      warnings.push(makeWarning('critical-not-highest', 'checked-fixture', crit.id, `the highest checked fixture is "${highest.label}"`));
    }
    if (hyd.nodeDevelopedLengthM[crit.nodeIdx] < maxL - SAME_PLACE_M) {
      warnings.push(makeWarning('critical-not-farthest', 'checked-fixture', crit.id, `the farthest checked fixture is "${farthest.label}"`));
    }
    const expected = model.fixtures.filter((f) => f.expectedCritical);
    if (expected.length > 0 && !expected.some((f) => f.id === crit.id)) {
      warnings.push(makeWarning('critical-not-expected', 'checked-fixture', crit.id, `expected: ${expected.map((f) => `"${f.label}"`).join(', ')}`));
    }
  }

  // Velocity
  const limitByClass = new Map<string, number>();
  for (const lim of model.criteria.velocityLimits) {
    if (lim.service === model.service) limitByClass.set(lim.material, lim.maxVelocityMs);
  }
  const seg = model.seg;
  const velocityLimitMs: (number | null)[] = new Array(seg.count);
  const velocityPass: (boolean | null)[] = new Array(seg.count);
  const noLimit = new Set<string>();
  for (let s = 0; s < seg.count; s++) {
    const velocityClass = seg.velocityClass[s];
    const lim = limitByClass.get(velocityClass);
    if (lim === undefined) {
      velocityLimitMs[s] = null;
      velocityPass[s] = null;
      noLimit.add(velocityClass);
      continue;
    }
    velocityLimitMs[s] = lim;
    const ok = hyd.velocity[s] <= lim;
    velocityPass[s] = ok;
    if (!ok) {
      failures++;
      warnings.push(
        makeWarning(
          'velocity-over-limit',
          'segment',
          seg.id[s],
          `${fromSI('velocity', hyd.velocity[s], sys).toFixed(2)} > ${fromSI('velocity', lim, sys).toFixed(2)} ${sys === 'US' ? 'ft/s' : 'm/s'}`,
        ),
      );
    }
  }
  for (const c of noLimit) warnings.push(makeWarning('no-velocity-limit', 'system', model.doc.id, `${c} pipe, ${model.service} water`));

  // Static pressure at every node that serves fixtures.
  const nodeStaticPass: (boolean | null)[] = new Array(model.nodeIds.length);
  const max = model.criteria.maxStaticPressurePa;
  for (let i = 0; i < model.nodeIds.length; i++) {
    const serves = model.servesFixtures[i] === 1;
    if (!serves) {
      nodeStaticPass[i] = null;
      continue;
    }
    const ok = hyd.nodeStaticHighPa[i] <= max;
    nodeStaticPass[i] = ok;
    if (!ok) {
      failures++;
      warnings.push(makeWarning('static-over-max', 'node', model.nodeIds[i], `${psys(hyd.nodeStaticHighPa[i])} > ${psys(max)}`));
    }
  }
  return { fixtures, criticalIndex, velocityLimitMs, velocityPass, nodeStaticPass, failures };
}
