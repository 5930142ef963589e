/**
 * Stage 5: hydraulics. One forward pass over the breadth-first order computes, for each
 * segment at its design flow: velocity, Reynolds number, friction factor and loss, fittings'
 * K (referred to the segment's own velocity) and loss, the size-change loss at its start,
 * the devices at its inlet, the rise, and the pressures at both ends. Everything is SI.
 *
 * Pressure along a segment (the order the ledger repeats, operation for operation):
 *   p = p(from node); for each device in list order: p −= its loss (a PRV's loss is
 *   p − min(p, set − fall-off·Q); a constant-speed booster's is its curve/fixed loss − gain(Q);
 *   a variable-speed booster's is p − max(p − its own loss, set discharge pressure));
 *   p −= friction; p −= fittings (incl. size change); p −= ρ·g·rise  →  p(to node).
 */
import { darcyFrictionFactor, hazenWilliamsPressureLoss, type DarcyFrictionResult, type FlowRegime } from '../friction';
import { fittingK, suddenContractionK, suddenExpansionK, changeKBasis, FITTING_TYPES, type FittingKResult } from '../fittings';
import { lossCurveAt } from '../devices/lossCurve';
import { flowTestPressureAt } from '../supply/flowTest';
import { G } from '../units';
import { makeGroupedWarning, makeWarning, type EngineWarning } from '../warnings';
import { inputError } from '../errors';
import type { SiModel } from './input';
import type { Topology } from './topology';
import type { DemandResult } from './demand';
import type { ElevationResult } from './elevations';
import type { SiBoost } from './input';

/** Relative difference in inside diameter below which two sizes count as equal (round-off of catalog data). */
const SAME_DIAMETER_RTOL = 1e-9;

/** Shared (frozen) empty list for the many segments without devices. */
const NO_DEVICES: DeviceLossSI[] = Object.freeze([]) as unknown as DeviceLossSI[];

export interface DeviceLossSI {
  deviceId: string;
  kind: string;
  label: string;
  lossPa: number;
  extrapolated: boolean;
}

export interface HydraulicsResult {
  velocity: Float64Array;
  reynolds: Float64Array;
  frictionFactor: Float64Array;
  regime: FlowRegime[];
  fittingsK: Float64Array;
  sizeChangeK: Float64Array;
  frictionLossPa: Float64Array;
  fittingLossPa: Float64Array;
  riseM: Float64Array;
  riseLossPa: Float64Array;
  deviceLossPa: Float64Array;
  devices: DeviceLossSI[][];
  inletPa: Float64Array;
  outletPa: Float64Array;
  nodePressurePa: Float64Array;
  nodeStaticHighPa: Float64Array;
  nodeStaticLowPa: Float64Array;
  nodeDevelopedLengthM: Float64Array;
  /** High static pressure in each segment just after its inlet devices (the pipe's upstream end). */
  segStaticHighInletPa: Float64Array;
  /** Per booster (device id): gain at the design flow and at no flow, Pa (the static checks report them). */
  boosterGains: Map<string, { designPa: number; shutoffPa: number }>;
  source: { pressurePa: number; basis: 'flow-test' | 'low-static' };
}

/**
 * Gain of a constant-speed pump at flow Q: gain(Q) = shutoff − (shutoff − design)·(Q/Qd)², the
 * parabola through the shutoff and design points (common practice for a centrifugal pump at fixed
 * speed). Qd defaults to Q itself (the design point is at the system's design flow). Not below 0.
 */
export function constantSpeedGainPa(b: Extract<SiBoost, { control: 'constant-speed' }>, flowM3s: number): number {
  const qd = b.designFlowM3s ?? flowM3s;
  if (!(qd > 0)) return b.shutoffPa;
  const r = flowM3s / qd;
  return Math.max(0, b.shutoffPa - (b.shutoffPa - b.designPa) * r * r);
}

export function computeHydraulics(model: SiModel, topo: Topology, demand: DemandResult, elev: ElevationResult, warnings: EngineWarning[]): HydraulicsResult {
  const seg = model.seg;
  const nSegs = seg.count;
  const nNodes = model.nodeIds.length;
  const { density: rho, kinematicViscosity: nu } = model.water;
  const rhoG = rho * G;
  const method = model.criteria.frictionMethod;
  const fittingMethod = model.criteria.fittingMethod;

  const r: HydraulicsResult = {
    velocity: new Float64Array(nSegs),
    reynolds: new Float64Array(nSegs),
    frictionFactor: new Float64Array(nSegs),
    // Segments not reached from the source (verdict incomplete) keep these no-flow values.
    regime: new Array<FlowRegime>(nSegs).fill('laminar'),
    fittingsK: new Float64Array(nSegs),
    sizeChangeK: new Float64Array(nSegs),
    frictionLossPa: new Float64Array(nSegs),
    fittingLossPa: new Float64Array(nSegs),
    riseM: new Float64Array(nSegs),
    riseLossPa: new Float64Array(nSegs),
    deviceLossPa: new Float64Array(nSegs),
    devices: new Array<DeviceLossSI[]>(nSegs).fill(NO_DEVICES),
    inletPa: new Float64Array(nSegs),
    outletPa: new Float64Array(nSegs),
    nodePressurePa: new Float64Array(nNodes),
    nodeStaticHighPa: new Float64Array(nNodes),
    nodeStaticLowPa: new Float64Array(nNodes),
    nodeDevelopedLengthM: new Float64Array(nNodes),
    segStaticHighInletPa: new Float64Array(nSegs),
    boosterGains: new Map(),
    source: sourcePressure(model, demand, warnings),
  };

  const src = model.source.nodeIdx;
  r.nodePressurePa[src] = r.source.pressurePa;
  r.nodeStaticHighPa[src] = model.source.staticHighPa;
  r.nodeStaticLowPa[src] = model.source.staticLowPa;

  // K from Crane's N·f_T (by nominal size) or a constant K does not depend on the flow: one
  // evaluation per catalog size and fitting type serves every segment of that size.
  const flowFreeK: FlowFreeKCache = new Map();
  // The friction factor is a function of (Re, ε/D) alone: the many segments of a repeated floor or
  // apartment carry the same flow in the same pipe, and take the result computed for the first
  // (the same function of the same arguments, so the same number).
  const frictionMemo = method === 'hazen-williams' ? null : new FrictionMemo(method);
  const sizeChangeIds: string[] = [];
  let boosterSeen = false;
  for (let k = 0; k < topo.order.length; k++) {
    const s = topo.order[k];
    const id = seg.id[s];
    const lengthM = seg.lengthM[s];
    const Q = demand.designFlowM3s[s];
    const D = seg.innerDiameterM[s];
    const area = (Math.PI * D * D) / 4;
    const V = Q / area;
    const Re = (V * D) / nu;
    const dynamicPressure = 0.5 * rho * V * V;
    r.velocity[s] = V;
    r.reynolds[s] = Re;

    // Friction
    let f = 0;
    let frictionPa = 0;
    let regime: FlowRegime = Re >= 4000 ? 'turbulent' : Re >= 2300 ? 'transitional' : 'laminar';
    if (Q > 0) {
      if (method === 'hazen-williams') {
        frictionPa = hazenWilliamsPressureLoss(Q, D, lengthM, seg.hazenWilliamsC[s]);
        // Darcy factor equivalent to the Hazen–Williams loss, for reporting and for the fittings.
        f = (frictionPa * D) / (lengthM * dynamicPressure);
      } else {
        const fr = frictionMemo!.get(Re, seg.roughnessM[s] / D);
        f = fr.f;
        regime = fr.regime;
        frictionPa = f * (lengthM / D) * dynamicPressure;
        if (fr.regime === 'laminar') warnings.push(makeWarning('laminar-flow', 'segment', id, `Re = ${Math.round(Re)}`));
        else if (fr.regime === 'transitional') warnings.push(makeWarning('transitional-flow', 'segment', id, `Re = ${Math.round(Re)}`));
        else if (fr.outsideValidity) warnings.push(makeWarning('friction-outside-validity', 'segment', id, fr.note));
      }
    }
    r.frictionFactor[s] = f;
    r.regime[s] = regime;
    r.frictionLossPa[s] = frictionPa;

    // Fittings, referred to this segment's velocity; evaluated only with flow (K of the
    // Reynolds-dependent methods is undefined at Re = 0, and the loss is zero anyway).
    let kFittings = 0;
    if (Q > 0) {
      const fits = seg.fittings[s];
      const sizeKey = seg.nominalSizeKey[s];
      // Guard conditions of fittingK that vary by segment; when they fail, fittingK itself throws.
      const argsOk = Re >= 0 && Re < Infinity && f >= 0 && f < Infinity;
      const bySize = sizeKey === '' ? undefined : flowFreeK.get(sizeKey);
      const own = seg.customFittings[s];
      for (let i = 0; i < fits.length; i++) {
        const fit = fits[i];
        const custom = own === null ? null : own[i];
        if (custom !== null) {
          // Own data (rule in schema.ts, CustomFittingSchema): K as given, or K = f·L/D of this pipe.
          kFittings += fit.count * (custom.k !== undefined ? custom.k : (f * custom.equivalentLengthM) / D);
          continue;
        }
        let res: FlowFreeK | undefined = argsOk && bySize !== undefined ? bySize.get(fit.typeId) : undefined;
        if (res === undefined) {
          let full: FittingKResult;
          try {
            full = fittingK(fit.typeId, {
              method: fittingMethod,
              innerDiameterM: D,
              nominalSizeIn: seg.nominalSizeIn[s],
              nominalSizeKey: sizeKey,
              Re,
              frictionFactor: f,
            });
          } catch (e) {
            // a fitting type published only for some sizes (the PEX makers' tables stop at 1 in), used at another
            if (!(e instanceof RangeError) || !e.message.includes('has no data')) throw e;
            throw inputError(
              'unknown-catalog-entry',
              'fitting',
              id,
              'typeId',
              `${FITTING_TYPES[fit.typeId]?.label ?? fit.typeId} has no published loss at size ${sizeKey || 'of this pipe'} on segment "${seg.label[s] ?? id}": choose a fitting type published for this size, or give the fitting's own K or equivalent length with its source`,
            );
          }
          res = full;
          // a measured fitting's tested range depends on the flow: its K is asked for each segment
          if ((full.method === 'crane' || full.fixedK === true) && FITTING_TYPES[fit.typeId]?.testedRe === undefined) {
            rememberFlowFreeK(flowFreeK, sizeKey, fit.typeId, full);
          }
          if (full.outsideTestedRe !== undefined) {
            const { min, max } = full.outsideTestedRe;
            warnings.push(
              makeWarning(
                'fitting-outside-tested-re',
                'fitting',
                id,
                `${FITTING_TYPES[fit.typeId]?.label ?? fit.typeId}: Re = ${Math.round(Re)}, tested ${Math.round(min)}–${Math.round(max)}`,
              ),
            );
          }
        }
        kFittings += fit.count * res.K;
        if (res.fellBackFrom !== undefined) {
          warnings.push(
            makeWarning('fitting-method-fallback', 'fitting', id, `${FITTING_TYPES[fit.typeId]?.label ?? fit.typeId}: ${res.fellBackFrom} → ${res.method}`),
          );
        }
      }
    }
    // Size change at the start of the segment, carrying this segment's flow.
    let kSize = 0;
    const parent = topo.parentSeg[s];
    if (seg.reducerAuto[s] === 1 && parent !== -1 && Q > 0) {
      const Dp = seg.innerDiameterM[parent];
      if (Math.abs(Dp - D) > SAME_DIAMETER_RTOL * D) {
        kSize = Dp < D ? changeKBasis(suddenExpansionK(Dp, D), Dp, D) : suddenContractionK(Dp, D);
        sizeChangeIds.push(id);
      }
    }
    r.fittingsK[s] = kFittings;
    r.sizeChangeK[s] = kSize;
    const fittingPa = (kFittings + kSize) * dynamicPressure;
    r.fittingLossPa[s] = fittingPa;

    // Rise: one truth per node (elevations.ts): the typed rise, or the difference of two placed nodes.
    const rise = elev.riseM[s];
    r.riseM[s] = rise;
    const risePa = rhoG * rise;
    r.riseLossPa[s] = risePa;

    // Pressures
    const from = seg.from[s];
    const to = seg.to[s];
    const inlet = r.nodePressurePa[from];
    let p = inlet;
    let staticHigh = r.nodeStaticHighPa[from];
    let staticLow = r.nodeStaticLowPa[from];
    let deviceTotal = 0;
    const segDevices = model.devicesBySeg[s];
    const devs: DeviceLossSI[] = segDevices.length === 0 ? NO_DEVICES : [];
    for (let j = 0; j < segDevices.length; j++) {
      const d = segDevices[j];
      let loss = 0;
      let extrapolated = false;
      if (d.curve) {
        const c = lossCurveAt(d.curve, Q);
        loss = c.lossPa;
        extrapolated = c.extrapolated;
        if (extrapolated) warnings.push(makeWarning('device-curve-extrapolated', 'device', d.id));
      } else if (d.fixedLossPa !== null) {
        loss = Q > 0 ? d.fixedLossPa : 0;
      }
      if (d.prv) {
        const outlet = Math.min(p - loss, d.prv.setPa - d.prv.falloffPaPerM3s * Q);
        if (d.prv.setPa - d.prv.falloffPaPerM3s * Q > p - loss) {
          warnings.push(makeWarning('prv-inlet-below-set', 'device', d.id));
        } else {
          warnings.push(makeWarning('prv-active', 'device', d.id));
        }
        loss = p - outlet;
        // At no flow the outlet sits at the set pressure (or the inlet, if lower).
        staticHigh = Math.min(staticHigh, d.prv.setPa);
        staticLow = Math.min(staticLow, d.prv.setPa);
      }
      const b = d.boost;
      if (b !== null && b.control === 'constant-speed') {
        // Design flow: gain(Q) on the pump's curve. No flow: the shutoff gain for the high static
        // (the worst case for the maximum); the design gain for the low static (the least it adds running).
        const gain = constantSpeedGainPa(b, Q);
        if (gain === 0 && b.shutoffPa > 0) warnings.push(makeWarning('booster-beyond-curve', 'device', d.id));
        if (gain > 0) {
          loss -= gain;
          boosterSeen = true;
        }
        staticHigh += b.shutoffPa;
        staticLow += b.designPa;
        r.boosterGains.set(d.id, { designPa: gain, shutoffPa: b.shutoffPa });
      } else if (b !== null) {
        // Variable speed: the drive holds the discharge at the set pressure at any flow, unless the
        // inlet is already above it (the pump then idles, common practice for pressure-boosting sets).
        const before = p - loss;
        const outlet = Math.max(before, b.setPa);
        loss = p - outlet;
        const shutoffPa = Math.max(0, b.setPa - staticHigh);
        staticHigh = Math.max(staticHigh, b.setPa);
        staticLow = Math.max(staticLow, b.setPa);
        r.boosterGains.set(d.id, { designPa: outlet - before, shutoffPa });
        boosterSeen = true;
      }
      p -= loss;
      deviceTotal += loss;
      devs.push({ deviceId: d.id, kind: d.kind, label: d.label, lossPa: loss, extrapolated });
    }
    p -= frictionPa;
    p -= fittingPa;
    p -= risePa;
    r.segStaticHighInletPa[s] = staticHigh;
    r.devices[s] = devs;
    r.deviceLossPa[s] = deviceTotal;
    r.inletPa[s] = inlet;
    r.outletPa[s] = p;
    r.nodePressurePa[to] = p;
    r.nodeStaticHighPa[to] = staticHigh - risePa;
    r.nodeStaticLowPa[to] = staticLow - risePa;
    r.nodeDevelopedLengthM[to] = r.nodeDevelopedLengthM[from] + lengthM;
  }
  if (sizeChangeIds.length > 0) warnings.push(makeGroupedWarning('size-change-loss', 'segment', sizeChangeIds));
  if (boosterSeen) warnings.push(makeWarning('booster-gain-at-static', 'system', model.doc.id));
  return r;
}

/** Slots of the friction memo: a power of two; more than the distinct (Re, ε/D) pairs of a repeated building. */
const FRICTION_MEMO_BITS = 10;

/**
 * The friction factor's results by (Re, ε/D), direct-mapped: a slot per hash of the two numbers'
 * bits, overwritten on a miss. Fixed size (no table that grows with the tree); a result is the
 * same function of the same arguments, so reusing it changes no number.
 */
class FrictionMemo {
  private readonly re = new Float64Array(1 << FRICTION_MEMO_BITS).fill(Number.NaN);
  private readonly eD = new Float64Array(1 << FRICTION_MEMO_BITS);
  private readonly result: DarcyFrictionResult[] = new Array(1 << FRICTION_MEMO_BITS);
  private readonly bits = new Float64Array(1);
  private readonly words = new Int32Array(this.bits.buffer);

  constructor(private readonly method: Parameters<typeof darcyFrictionFactor>[0]) {}

  get(Re: number, relRoughness: number): DarcyFrictionResult {
    const { bits, words } = this;
    bits[0] = Re;
    let h = Math.imul(words[0] ^ words[1], 0x9e3779b1);
    bits[0] = relRoughness;
    h = Math.imul(h ^ words[0] ^ Math.imul(words[1], 0x85ebca6b), 0xc2b2ae35);
    const slot = h >>> (32 - FRICTION_MEMO_BITS);
    if (this.re[slot] === Re && this.eD[slot] === relRoughness) return this.result[slot];
    const r = darcyFrictionFactor(this.method, Re, relRoughness);
    this.re[slot] = Re;
    this.eD[slot] = relRoughness;
    this.result[slot] = r;
    return r;
  }
}

/** What the hydraulics stage uses of a fittingK result. */
interface FlowFreeK {
  K: number;
  method: FittingKResult['method'];
  fellBackFrom?: FittingKResult['fellBackFrom'];
}
/** Nominal size key (catalog sizes only) → fitting type id → K that does not depend on the flow. */
type FlowFreeKCache = Map<string, Map<string, FlowFreeK>>;

function rememberFlowFreeK(cache: FlowFreeKCache, sizeKey: string, typeId: string, res: FittingKResult): void {
  if (sizeKey === '') return; // custom pipes: nominal size stands in from the inside diameter, not cached
  let bySize = cache.get(sizeKey);
  if (bySize === undefined) {
    bySize = new Map();
    cache.set(sizeKey, bySize);
  }
  bySize.set(typeId, res);
}

function sourcePressure(model: SiModel, demand: DemandResult, warnings: EngineWarning[]): HydraulicsResult['source'] {
  const src = model.source;
  const id = model.nodeIds[src.nodeIdx];
  const min = model.criteria.minStaticPressurePa;
  if (min !== undefined && src.staticLowPa < min) warnings.push(makeWarning('static-below-min', 'source', id));
  if (src.flowTest) {
    const Q = demand.source.designFlowM3s;
    warnings.push(makeWarning('flow-test-used', 'source', id));
    if (Q > src.flowTest.testFlowM3s) warnings.push(makeWarning('flow-test-beyond-test-flow', 'source', id));
    if (src.flowTest.staticPa > src.staticLowPa) warnings.push(makeWarning('flow-test-static-above-low', 'source', id));
    return { pressurePa: flowTestPressureAt(Q, src.flowTest), basis: 'flow-test' };
  }
  warnings.push(makeWarning('source-low-static-used', 'source', id));
  return { pressurePa: src.staticLowPa, basis: 'low-static' };
}
