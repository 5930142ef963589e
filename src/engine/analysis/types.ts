/**
 * The shapes the analysis returns. The top-level fields are in the document's unit system
 * (see `units`); `si` holds the same results in SI base units (Pa, m, m³/s, m/s) — the numbers
 * the engine computed, from which the display values were converted — so that a consumer can
 * convert to another unit system and the ledger can add up exactly.
 */
import type { UnitSystem } from '../units';
import type { EngineWarning } from '../warnings';
import type { FlowRegime } from '../friction';
import type { RecirculationAnalysis } from '../hotWater/recirculationDocument';

export interface DeviceLossResult {
  deviceId: string;
  kind: string;
  label: string;
  /** Pressure change through the device, as a loss (negative for a booster's net gain). */
  loss: number;
  extrapolated: boolean;
}

export interface SegmentResult {
  id: string;
  label: string | null;
  from: string;
  to: string;
  /** Segment feeding this one's upstream node; null at the source. */
  parentSegmentId: string | null;
  /** Water supply fixture units downstream of (and served through) this segment. */
  wsfu: number;
  demandCurve: 'flush-tank' | 'flush-valve' | null;
  flowBasis: 'fixture-units' | 'binomial' | 'override' | 'continuous-only' | 'none';
  designFlow: number;
  innerDiameter: number;
  length: number;
  /** Elevation change used (downstream node − upstream node). */
  rise: number;
  velocity: number;
  reynolds: number;
  frictionFactor: number;
  regime: FlowRegime;
  /** Σ count·K of the fittings, referred to this segment's velocity. */
  fittingsK: number;
  /** Sudden expansion or contraction at the segment's start, referred to this segment's velocity. */
  sizeChangeK: number;
  /** fittingsK + sizeChangeK, referred to this segment's velocity. */
  totalK: number;
  frictionLoss: number;
  fittingLoss: number;
  riseLoss: number;
  deviceLoss: number;
  devices: DeviceLossResult[];
  inletPressure: number;
  outletPressure: number;
  velocityLimit: number | null;
  velocityPass: boolean | null;
  /** Developed length of pipe from the source to this segment's downstream node. */
  developedLength: number;
}

export interface NodeResult {
  id: string;
  label: string | null;
  elevation: number;
  /** Residual (flowing) pressure at design flow. */
  pressure: number;
  /** Source high static less the climb (with PRVs and boosters applied) — for the maximum check. */
  staticPressureHigh: number;
  /** Source low static less the climb (with PRVs and boosters applied). */
  staticPressureLow: number;
  /** True when this node serves fixtures and its high static is within the maximum. */
  staticPass: boolean | null;
  developedLength: number;
  feedSegmentId: string | null;
}

export interface FixtureResult {
  id: string;
  nodeId: string;
  fixtureTypeId: string;
  label: string;
  residual: number;
  required: number;
  margin: number;
  pass: boolean;
  flowRate: number;
  elevation: number;
  developedLength: number;
  /** Segment ids from the source to the fixture's node. */
  path: string[];
}

export interface SourceResult {
  nodeId: string;
  kind: string;
  elevation: number;
  designFlow: number;
  /** Pressure available at the source at the design flow: the ledger's start. */
  pressureAtDesignFlow: number;
  pressureBasis: 'flow-test' | 'low-static';
  staticPressureLow: number;
  staticPressureHigh: number;
}

/**
 * Why a verdict is Incomplete: something Headroom needs before it can say pass or fail (a missing
 * or assumed input, or a description that does not reach a checked fixture). Never shown green.
 */
export interface IncompleteReason {
  /** Stable code, e.g. 'no-checked-fixtures', 'source-pressure-missing', 'node-elevation-missing'. */
  code: string;
  elementType: 'system' | 'source' | 'device' | 'node' | 'segment' | 'fixture-group' | 'checked-fixture' | 'fitting';
  elementId: string | null;
  /** The name the user typed for the element, or a plain description (absent in analyses stored before it existed). */
  elementLabel?: string;
  /** Plain words, in the document's units, naming elements by the labels the user typed. */
  message: string;
}

/** pass: every checked fixture computed from a complete description and every check met; fail: a check is not met; incomplete: see the reasons. */
export type VerdictStatus = 'pass' | 'fail' | 'incomplete';

/**
 * Worst-case static pressure results (analysis/staticChecks.ts), in the document's units.
 * boosters: gains counted; prvFailOpen: per PRV, what its failing open would do downstream;
 * pipeRatings: per catalog material and size, the segment with the highest static pressure against
 * the published rating; minStaticAtHighestFixture: null when the criteria set no minimum.
 */
export interface StaticChecks {
  boosters: { deviceId: string; label: string; control: 'constant-speed' | 'variable-speed'; designGain: number; shutoffGain: number; assumed: boolean }[];
  prvFailOpen: {
    deviceId: string;
    label: string;
    nodesOverMax: number;
    worstNodeId: string | null;
    worstNodeLabel: string | null;
    worstStatic: number;
    maxStaticPressure: number;
    excess: number;
  }[];
  pipeRatings: {
    segmentId: string;
    label: string;
    materialLabel: string;
    ratingPressure: number;
    highestStatic: number;
    pass: boolean;
    source: string;
    verified: boolean;
  }[];
  minStaticAtHighestFixture: { fixtureId: string; label: string; staticLow: number; minimum: number; pass: boolean } | null;
}

/** A place and the pressure there, in the document's units. */
export interface ZonePressureAt {
  pressure: number;
  nodeId: string;
  /** The node's typed label, else a plain description. */
  where: string;
}

/**
 * One pressure zone (analysis/zones.ts): the part of the system fed from the supply, or through one
 * PRV or booster pump. Pressures and elevations in the document's units.
 */
export interface ZoneResult {
  /** 'supply' for the first zone, else the feeding device's id. */
  id: string;
  /** 1-based, in the tree's breadth-first order. */
  index: number;
  /** "Zone 1 — from the supply", "Zone 2 — PRV-2 (set 65 psi)". */
  name: string;
  /** The zone this one is fed from (nested zones); null for the supply's. */
  parentZoneId: string | null;
  feed: {
    kind: 'supply' | 'prv' | 'booster-pump';
    deviceId: string | null;
    deviceLabel: string | null;
    /** 'set': a PRV's outlet or a variable-speed booster's discharge set pressure; 'gain': a constant-speed booster's design gain. */
    setting: 'set' | 'gain' | null;
    pressure: number | null;
  };
  /** The segment whose inlet device opens the zone (null for the supply's); the boundary on the profile and the diagram. */
  entrySegmentId: string | null;
  /** The node upstream of the boundary (the source node for the supply's zone). */
  entryNodeId: string;
  /**
   * Names of the floors of the nodes it serves fixtures at, lowest first (of all its nodes where it
   * serves none; empty when the document places no node on a floor). The elevations likewise.
   */
  floors: string[];
  /**
   * The same floors as runs of adjacent floors of the document (lowest first): one run for a zone
   * of Levels 1–12, two for Level 1 and Levels 5–7. Absent from analyses stored before it existed.
   */
  floorRuns?: { from: string; to: string; count: number }[];
  lowestElevation: number | null;
  highestElevation: number | null;
  nodeCount: number;
  segmentCount: number;
  highestResidual: ZonePressureAt | null;
  lowestResidual: ZonePressureAt | null;
  /** Highest high static pressure at a node that serves fixtures, against the criteria's maximum. */
  highestStatic: (ZonePressureAt & { maximum: number; pass: boolean }) | null;
  criticalFixture: { fixtureId: string; label: string; residual: number; required: number; margin: number; pass: boolean } | null;
  checkedFixtures: number;
  /** Fixture groups served in the zone. */
  fixtureGroups: number;
  failingFixtures: number;
  velocityFailures: number;
  staticFailures: number;
  /** As the system's verdict, plus 'not-checked': no checked fixture in the zone and no failed check (never shown green). */
  status: VerdictStatus | 'not-checked';
  /** Why the zone is incomplete, in words; empty otherwise. */
  incomplete: string[];
}

export interface MethodUsed {
  id: string;
  label: string;
  source: string;
}

export interface AnalysisResults {
  source: SourceResult;
  segments: SegmentResult[];
  nodes: NodeResult[];
  fixtures: FixtureResult[];
}

export interface Analysis extends AnalysisResults {
  engineVersion: string;
  schemaVersion: number;
  systemId: string;
  name: string;
  service: 'cold' | 'hot';
  unitSystem: UnitSystem;
  /** Unit of each kind of value in the top-level results. */
  units: {
    pressure: string;
    length: string;
    elevation: string;
    diameter: string;
    flow: string;
    velocity: string;
    temperature: string;
    density: string;
  };
  water: { temperature: number; densityKgM3: number; kinematicViscosityM2s: number; dynamicViscosityPaS: number };
  criticalFixtureId: string | null;
  verdict: {
    /** The one verdict to show: incomplete wins over fail and pass (see verdictStatus). */
    status: VerdictStatus;
    /** Empty unless status is 'incomplete'. */
    incomplete: IncompleteReason[];
    allFixturesPass: boolean;
    allVelocitiesPass: boolean;
    allStaticPass: boolean;
    failures: number;
  };
  methods: {
    friction: MethodUsed;
    fittings: MethodUsed;
    demand: MethodUsed;
    water: MethodUsed;
    elevation: MethodUsed;
    supply: MethodUsed;
    devices: MethodUsed;
  };
  criteria: {
    maxStaticPressure: number;
    minStaticPressure: number | null;
    velocityLimits: { material: string; service: string; maxVelocity: number; source: string }[];
    demandCurve: string;
    demandMethod: string;
    frictionMethod: string;
    fittingMethod: string;
  };
  /** Worst-case static pressure: boosters at no flow, PRVs failing open, pipe ratings, minimum static at the highest fixture. */
  staticChecks: StaticChecks;
  /** Pressure zones (analysis/zones.ts), the supply's first; absent in analyses stored before zones existed. */
  zones?: ZoneResult[];
  /** Hot water: the recirculation loop's flow, return sizes and pump (hotWater/recirculationDocument.ts), when the document describes one. */
  recirculation?: RecirculationAnalysis;
  warnings: EngineWarning[];
  /** The same results in SI base units: Pa, m, m³/s, m/s. */
  si: AnalysisResults;
}

export interface LedgerLine {
  step: number;
  kind: 'start' | 'device' | 'friction' | 'fittings' | 'rise';
  /** Segment id or device id (source node id for the start line). */
  elementId: string;
  segmentId: string | null;
  label: string;
  /** Signed change in pressure (negative = deduction); for the start line, the start pressure. */
  change: number;
  /** Pressure after this line. */
  pressureAfter: number;
  changeSI: number;
  pressureAfterSI: number;
}

export interface PressureLedger {
  fixtureId: string;
  nodeId: string;
  unitSystem: UnitSystem;
  pressureUnit: string;
  lines: LedgerLine[];
  residual: number;
  required: number;
  margin: number;
  pass: boolean;
  residualSI: number;
}
