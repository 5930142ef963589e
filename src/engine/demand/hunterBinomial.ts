import { requireFinite, requireNonNegative, requirePositive } from '../guards';

export interface FixtureUseGroup {
  /** Number of fixtures of this kind, n (integer ≥ 0). */
  count: number;
  /** Flow of one fixture while in use, q, m³/s (≥ 0). */
  flowM3s: number;
  /** Duration of one use, t, s (> 0). */
  durationS: number;
  /** Time between uses at the peak, T, s (≥ t). */
  recurrenceS: number;
}

/** Probability mass below which a binomial term is dropped (far tail; its effect is < 1e-14). */
const TAIL_CUTOFF = 1e-16;
/** Flow values are merged on a grid of this fraction of the maximum possible flow. */
const GRID_FRACTION = 1e-7;

function binomialTerms(n: number, p: number): [m: number, prob: number][] {
  if (p >= 1) return [[n, 1]];
  const out: [number, number][] = [];
  let logPmf = n * Math.log1p(-p);
  const logOdds = Math.log(p / (1 - p));
  for (let m = 0; m <= n; m++) {
    const prob = Math.exp(logPmf);
    if (prob >= TAIL_CUTOFF) out.push([m, prob]);
    logPmf += Math.log((n - m) / (m + 1)) + logOdds;
  }
  return out;
}

/**
 * Hunter's probabilistic demand: each fixture of a group is in use with probability p = t/T,
 * independently, so the number in use is binomial B(n, p). The design flow is the smallest total
 * flow F with P(total flow ≤ F) ≥ percentile (0.99: exceeded 1 % of the time). For one group this
 * is m·q with the smallest m such that Σ_{r=0}^{m} C(n,r)·pʳ(1−p)^(n−r) ≥ 0.99; several groups are
 * combined by convolving their distributions of flow (flows merged on a grid of 1e-7 of the
 * maximum possible flow).
 *
 * @param groups fixture groups with n, q (m³/s), t (s), T (s)
 * @param percentile the non-exceedance probability, 0 < percentile < 1 (default 0.99)
 * @returns design flow in m³/s
 * Reference: R. B. Hunter, "Methods of Estimating Loads in Plumbing Systems", NBS Building
 * Materials and Structures Report BMS65 (1940); 99th-percentile criterion as described by
 * C. Lohr, PM Engineer. The exact algebraic form is from memory.
 */
export function hunterBinomialDemand(groups: readonly FixtureUseGroup[], percentile = 0.99): number {
  requireFinite('hunterBinomialDemand', 'percentile', percentile);
  if (!(percentile > 0 && percentile < 1)) {
    throw new RangeError(`hunterBinomialDemand: percentile must be between 0 and 1 (exclusive), got ${percentile}`);
  }
  let maxFlow = 0;
  for (const [i, g] of groups.entries()) {
    const fn = `hunterBinomialDemand (group ${i})`;
    requireNonNegative(fn, 'count', g.count);
    if (!Number.isInteger(g.count)) throw new RangeError(`${fn}: count must be an integer, got ${g.count}`);
    requireNonNegative(fn, 'flowM3s', g.flowM3s);
    requirePositive(fn, 'durationS', g.durationS);
    requirePositive(fn, 'recurrenceS', g.recurrenceS);
    if (g.durationS > g.recurrenceS) {
      throw new RangeError(`${fn}: durationS (${g.durationS}) exceeds recurrenceS (${g.recurrenceS})`);
    }
    maxFlow += g.count * g.flowM3s;
  }
  if (maxFlow === 0) return 0;
  const grid = maxFlow * GRID_FRACTION;

  let dist = new Map<number, number>([[0, 1]]);
  for (const g of groups) {
    if (g.count === 0 || g.flowM3s === 0) continue;
    const terms = binomialTerms(g.count, g.durationS / g.recurrenceS);
    const next = new Map<number, number>();
    for (const [key, pv] of dist) {
      for (const [m, pm] of terms) {
        const k = key + Math.round((m * g.flowM3s) / grid);
        next.set(k, (next.get(k) ?? 0) + pv * pm);
      }
    }
    dist = next;
  }
  const keys = [...dist.keys()].sort((a, b) => a - b);
  let cdf = 0;
  for (const k of keys) {
    cdf += dist.get(k) as number;
    if (cdf >= percentile - 1e-12) return k * grid;
  }
  return keys[keys.length - 1] * grid;
}
