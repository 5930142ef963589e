/**
 * Pressure loss of an in-line device (meter, backflow preventer, strainer…) from the points of its
 * published loss curve, by monotone piecewise-cubic Hermite interpolation.
 *
 * Reference: F. N. Fritsch and R. E. Carlson, "Monotone piecewise cubic interpolation",
 * SIAM J. Numer. Anal. 17(2), 238–246 (1980) — tangents by the three-point formula, limited so that
 * α² + β² ≤ 9 (their sufficient condition for monotonicity).
 */
import { requireNonNegative } from '../guards';

export interface LossCurvePoint {
  flowM3s: number;
  lossPa: number;
}

export interface LossCurveResult {
  lossPa: number;
  /** True when flowM3s is beyond the last point (ΔP ∝ Q² extrapolation). */
  extrapolated: boolean;
}

function preparePoints(points: readonly LossCurvePoint[]): { x: number[]; y: number[] } {
  if (!Array.isArray(points) || points.length === 0) throw new RangeError('lossCurveAt: at least one curve point is required');
  const sorted = points
    .map((p, i) => ({
      flowM3s: requireNonNegative(`lossCurveAt (point ${i})`, 'flowM3s', p.flowM3s),
      lossPa: requireNonNegative(`lossCurveAt (point ${i})`, 'lossPa', p.lossPa),
    }))
    .sort((a, b) => a.flowM3s - b.flowM3s);
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i].flowM3s === sorted[i - 1].flowM3s) {
      throw new RangeError(`lossCurveAt: two points share the flow ${sorted[i].flowM3s} m³/s`);
    }
  }
  if (sorted[0].flowM3s > 0) sorted.unshift({ flowM3s: 0, lossPa: 0 });
  return { x: sorted.map((p) => p.flowM3s), y: sorted.map((p) => p.lossPa) };
}

/** Fritsch–Carlson tangents at each point. */
function monotoneTangents(x: readonly number[], y: readonly number[]): number[] {
  const n = x.length;
  const delta: number[] = [];
  for (let i = 0; i < n - 1; i++) delta.push((y[i + 1] - y[i]) / (x[i + 1] - x[i]));
  const m: number[] = new Array(n);
  m[0] = delta[0];
  m[n - 1] = delta[n - 2];
  for (let i = 1; i < n - 1; i++) m[i] = delta[i - 1] * delta[i] <= 0 ? 0 : (delta[i - 1] + delta[i]) / 2;
  for (let i = 0; i < n - 1; i++) {
    if (delta[i] === 0) {
      m[i] = 0;
      m[i + 1] = 0;
      continue;
    }
    const a = m[i] / delta[i];
    const b = m[i + 1] / delta[i];
    const s = a * a + b * b;
    if (s > 9) {
      const t = 3 / Math.sqrt(s);
      m[i] = t * a * delta[i];
      m[i + 1] = t * b * delta[i];
    }
  }
  return m;
}

/**
 * Device loss at flowM3s. The points are sorted by flow; (0, 0) is implied when no point has zero
 * flow. Between points: monotone cubic (Fritsch–Carlson). Beyond the last point: ΔP = ΔP_last·(Q/Q_last)²
 * (turbulent loss through a fixed geometry, common practice), flagged `extrapolated`.
 *
 * @param points curve points, flow in m³/s and loss in Pa (≥ 0)
 * @param flowM3s flow through the device, m³/s (≥ 0)
 */
export function lossCurveAt(points: readonly LossCurvePoint[], flowM3s: number): LossCurveResult {
  requireNonNegative('lossCurveAt', 'flowM3s', flowM3s);
  const { x, y } = preparePoints(points);
  const n = x.length;
  if (n === 1) return { lossPa: y[0], extrapolated: flowM3s > 0 }; // one point at zero flow: constant
  const qLast = x[n - 1];
  if (flowM3s > qLast) return { lossPa: y[n - 1] * (flowM3s / qLast) ** 2, extrapolated: true };
  const m = monotoneTangents(x, y);
  let i = 0;
  while (i < n - 2 && flowM3s > x[i + 1]) i++;
  const h = x[i + 1] - x[i];
  const t = (flowM3s - x[i]) / h;
  const t2 = t * t;
  const t3 = t2 * t;
  const lossPa = (2 * t3 - 3 * t2 + 1) * y[i] + (t3 - 2 * t2 + t) * h * m[i] + (-2 * t3 + 3 * t2) * y[i + 1] + (t3 - t2) * h * m[i + 1];
  return { lossPa, extrapolated: false };
}
