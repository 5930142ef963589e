/**
 * Public entry of the Headroom engine (pure: no I/O, no module state). The client and the
 * server import the same functions.
 */
export { analyzeSystem, safeAnalyzeSystem, type SafeAnalysis } from './analysis/analyze';
export { ledgerFor, formatLedger } from './analysis/ledger';
export { ENGINE_VERSION, toDisplay } from './analysis/report';
export { verdictStatus } from './analysis/verdict';
export type {
  Analysis,
  AnalysisResults,
  IncompleteReason,
  VerdictStatus,
  SegmentResult,
  NodeResult,
  FixtureResult,
  SourceResult,
  DeviceLossResult,
  MethodUsed,
  LedgerLine,
  PressureLedger,
  StaticChecks,
  ZoneResult,
  ZonePressureAt,
} from './analysis/types';
export { SCHEMA_VERSION } from './model/elements';
export {
  SystemDocumentSchema,
  DOCUMENT_BOUNDS,
  type Boost,
  type Floor,
  systemDocumentJsonSchema,
  type SystemDocument,
  type SystemDocumentInput,
  type Source,
  type Device,
  type DeviceLoss,
  type SystemNode,
  type FixtureGroup,
  type CheckedFixture,
  type Segment,
  type Fitting,
  type CustomPipe,
  type CustomFitting,
  type CustomFixture,
  type CriteriaOverrides,
  type SizingBasis,
} from './model/schema';
export { fittingLabel, fixtureGroupLabel, fixtureGroupWsfu, boosterDesignGain, boosterText } from './model/labels';
export { nodeElevations } from './model/positions';
export { readSystemDocument, type ReadResult } from './model/read';
export { upgradeDocument, upgradeDocumentWithReport, type RiseConflictRule, type RiseConflict, type UpgradeOptions } from './model/upgrade';
export { SystemDocumentSchemaV1, SCHEMA_VERSION_V1, type SystemDocumentV1 } from './model/schemaV1';
export { EngineInputError, ERROR_CODES, isEngineInputError, type ErrorCode, type EngineInputErrorJSON, type EngineIssue } from './errors';
export { WARNING_CODES, type WarningCode, type EngineWarning, type WarningSeverity } from './warnings';
export { groupWarnings, type WarningGroup } from './warningGroups';
export {
  LIMITS,
  FIELD_QUANTITIES,
  checkRange,
  rangeText,
  limitUnit,
  fieldUnit,
  siBase,
  formatBound,
  type LimitQuantity,
  type QuantityLimit,
  type Bounds,
} from './model/limits';
export { UNIT_LABELS, toSI, fromSI, type UnitSystem } from './units';
export {
  sizeSystem,
  SizingError,
  type SizingOptions,
  type SizingResult,
  type SizingConditions,
  type SegmentSizing,
  type Governing,
  type FixtureMargin,
} from './sizing/sizeSystem';
export { smallestSubstitute, DEFAULT_SUBSTITUTE_MATERIAL, type SubstituteResult } from './sizing/substitute';
export { sizesFingerprint, sizingBasisOf, sizingBasisState, sizingBasisText, type SizingBasisInput, type SizingBasisState } from './sizing/basis';
export { frictionBudgetOf, pressureAvailableForFriction, frictionBudgetPer100Ft, type FrictionBudget } from './sizing/frictionBudget';
export { thermalExpansionTank } from './hotWater/expansionTank';
export { closedSystemCheck, closingElementWords } from './hotWater/closedSystem';
export { applyFedFrom, resolveFedFrom, fedFromBasis } from './hotWater/fedFrom';
export { sizeDocumentExpansionTank } from './hotWater/expansionTankCheck';
export type { ExpansionTankSizing } from './hotWater/expansionTankCheck';
export type { ColdSupplyView, ClosingElementView } from './hotWater/fedFrom';
export { sizeRecirculation, recirculationFlow } from './hotWater/recirculation';
export { HotWaterInputError } from './hotWater/errors';
export { RecirculationSchema, RecirculationSegmentSchema, type Recirculation, type RecirculationSegment } from './model/schema';
export { analyseRecirculation, W_PER_BTU_PER_H, type RecirculationAnalysis, type RecirculationPipeResult } from './hotWater/recirculationDocument';
