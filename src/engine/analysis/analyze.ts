/**
 * The analysis pipeline: input → validation → topology → demand → hydraulics → checks →
 * report. Each stage takes the previous stages' results explicitly; nothing is kept between
 * calls. Structural problems throw EngineInputError; everything else becomes a warning.
 */
import { EngineInputError } from '../errors';
import type { EngineWarning } from '../warnings';
import { projectDataNotes } from './projectData';
import { expandBuilding } from '../building/expand';
import { borrowPipes, buildModel, parseDocument } from './input';
import { buildTopology } from './topology';
import { resolveElevations } from './elevations';
import { runStaticChecks } from './staticChecks';
import { labelWarnings } from './names';
import { pexMetalFittingWarnings } from './pexFittings';
import { expansionTankWarnings } from '../hotWater/expansionTankCheck';
import { addRecirculation } from '../hotWater/recirculationDocument';
import { computeDemand } from './demand';
import { computeHydraulics } from './hydraulics';
import { runChecks } from './checks';
import { assembleReport } from './report';
import { computeZones } from './zones';
import type { StageResults } from './results';
import type { Analysis } from './types';
import type { SystemDocument } from '../model/schema';

export function analyzeSystem(doc: unknown): Analysis {
  return analyzeValidated(parseDocument(doc));
}

/**
 * The analysis of a document that has already passed the schema (SystemDocumentSchema.parse):
 * what the live client re-runs on every edit. Catalog, reference and topology checks still run.
 */
export function analyzeValidated(parsed: SystemDocument): Analysis {
  return analyzeWithStages(parsed).analysis;
}

/**
 * The same analysis, with the stage arrays its result objects are read from (results.ts): for a
 * caller that reads every segment's numbers many times over (the sizing) without building the
 * 20,000 result objects of a large building. The numbers are the same ones, not a second computation.
 */
export function analyzeWithStages(parsed: SystemDocument): { analysis: Analysis; stages: StageResults } {
  // Typical units placed on floors become ordinary nodes and segments first (building/expand.ts).
  const model = buildModel(expandBuilding(parsed) as SystemDocument);
  const topo = buildTopology(model);
  borrowPipes(model, topo.order, topo.parentSeg);
  const elev = resolveElevations(model, topo);
  const warnings: EngineWarning[] = [];
  // One note for the fittings and one for the fixture groups that use the project's own data.
  warnings.push(...projectDataNotes(model.projectData));
  pexMetalFittingWarnings(model, warnings);
  expansionTankWarnings(model.doc, warnings);
  const demand = computeDemand(model, topo, warnings);
  const hyd = computeHydraulics(model, topo, demand, elev, warnings);
  const checks = runChecks(model, hyd, warnings);
  const stat = runStaticChecks(model, topo, hyd, elev, warnings);
  labelWarnings(model, warnings);
  // assembleReport ends with the last guard: no NaN or Infinity in the SI results (finite.ts).
  const analysis = assembleReport(model, topo, demand, hyd, checks, elev, stat, warnings);
  analysis.zones = computeZones(model, topo, hyd, checks, analysis.verdict.incomplete);
  addRecirculation(analysis, model.doc, model.criteria);
  return { analysis, stages: { model, topo, demand, hyd, checks } };
}

/**
 * Only the stages that compute the numbers (input → topology → elevations → demand → hydraulics
 * → checks), without the static checks, zones, report or notes: what the sizing reads of the
 * analyses it runs to measure candidate sizes and to verify a sized document. The same stage
 * functions as analyzeWithStages, in the same order, so the same numbers; the warnings they
 * raise are dropped (the sized document is analysed in full when the designer opens it).
 */
export function analyzeHydraulics(parsed: SystemDocument): StageResults {
  const model = buildModel(expandBuilding(parsed) as SystemDocument);
  const topo = buildTopology(model);
  borrowPipes(model, topo.order, topo.parentSeg);
  const elev = resolveElevations(model, topo);
  const warnings: EngineWarning[] = [];
  const demand = computeDemand(model, topo, warnings);
  const hyd = computeHydraulics(model, topo, demand, elev, warnings);
  const checks = runChecks(model, hyd, warnings);
  return { model, topo, demand, hyd, checks };
}

export type SafeAnalysis = { ok: true; analysis: Analysis } | { ok: false; error: EngineInputError };

/** Like analyzeSystem, but returns the structured error instead of throwing it. */
export function safeAnalyzeSystem(doc: unknown): SafeAnalysis {
  try {
    return { ok: true, analysis: analyzeSystem(doc) };
  } catch (e) {
    if (e instanceof EngineInputError) return { ok: false, error: e };
    if (e instanceof RangeError) {
      // A correlation refused its arguments: the document reached it with a value it cannot take.
      return {
        ok: false,
        error: new EngineInputError({ code: 'value-out-of-range', elementType: 'system', message: e.message }),
      };
    }
    if (e instanceof Error && e.message.startsWith('engine defect:')) {
      // Finite but absurd inputs (a length of 1e308 ft) overflow inside the arithmetic; the last
      // guard catches the Infinity, and the designer gets an input error instead of a crash.
      return {
        ok: false,
        error: new EngineInputError({
          code: 'value-out-of-range',
          elementType: 'system',
          message: `The inputs lead to a value too large to compute (${e.message.slice('engine defect: '.length)}). Check for absurd lengths, elevations, pressures or flows.`,
        }),
      };
    }
    throw e;
  }
}
