/**
 * The stored analysis of a revision: the one place that knows how it is kept in the database.
 *
 * Written by `toStoredAnalysis` (the repository calls it on every write) and read by
 * `readStoredAnalysis` (the repository calls it on every read), so no other code sees the stored
 * form. Each stored form carries its format number; a form written before formats existed (format 0:
 * the engine's answer as it was, `{ ok, analysis | error }`) is read as it is.
 *
 * Format 1 keeps the engine's SI results and everything else once: the display copies of the
 * source, segments, nodes and fixtures (the SI values in the document's units) are left out and
 * made again on reading with the engine's own conversion (`toDisplay`). The numbers an issued
 * revision was issued with are never recomputed: only their units are converted, exactly as the
 * engine did when it made them (tests/api/storedAnalysis.test.ts checks it is bit for bit).
 */
import { toDisplay, type Analysis, type EngineInputErrorJSON } from '../../src/engine';
import type { AnalysisOutcome } from '../../src/shared/api/systems';

/** The format this server writes. Raise it (and add a reader of the old one below) when the stored form changes. */
export const ANALYSIS_FORMAT = 1;

/** The display copies the engine makes from its SI results, left out of the stored form. */
type DisplayKeys = 'source' | 'segments' | 'nodes' | 'fixtures';
type CompactAnalysis = Omit<Analysis, DisplayKeys>;

/** Format 1, as stored in `revisions.analysis` (jsonb). */
export interface StoredAnalysisV1 {
  analysisFormat: 1;
  /** the engine version that made the result (also in the `engine_version` column) */
  engineVersion: string;
  result: { ok: true; analysis: CompactAnalysis } | { ok: false; error: EngineInputErrorJSON };
}

/** A stored analysis as read: the outcome with every display value, the engine that made it, and the format it was stored in. */
export interface ReadAnalysis {
  outcome: AnalysisOutcome;
  engineVersion: string;
  format: number;
}

/** The stored form of the engine's outcome (format ANALYSIS_FORMAT). */
export function toStoredAnalysis(outcome: AnalysisOutcome, engineVersion: string): StoredAnalysisV1 {
  if (!outcome.ok) return { analysisFormat: 1, engineVersion, result: { ok: false, error: outcome.error } };
  // eslint-disable-next-line @typescript-eslint/no-unused-vars -- the display copies are what is left out
  const { source, segments, nodes, fixtures, ...compact } = outcome.analysis;
  return { analysisFormat: 1, engineVersion, result: { ok: true, analysis: compact } };
}

const unreadable = (message: string): AnalysisOutcome => ({
  ok: false,
  error: { name: 'EngineInputError', code: 'schema-violation', elementType: 'system', elementId: null, field: null, message },
});

/**
 * Any stored analysis, of any format this server knows, as the outcome with every display value.
 * `engineVersionColumn` is the row's `engine_version`, the version of a format-0 analysis that could
 * not be computed (a computed one names its engine itself).
 */
export function readStoredAnalysis(stored: unknown, engineVersionColumn: string | null): ReadAnalysis {
  const raw = typeof stored === 'string' ? (JSON.parse(stored) as unknown) : stored;
  if (raw === null || typeof raw !== 'object') return { outcome: unreadable('Not analysed'), engineVersion: engineVersionColumn ?? 'unknown', format: 0 };
  const format = (raw as { analysisFormat?: unknown }).analysisFormat;
  if (format === undefined) {
    // format 0: the engine's answer as it was stored before formats existed
    const outcome = raw as AnalysisOutcome;
    const engineVersion = (outcome.ok ? outcome.analysis.engineVersion : null) ?? engineVersionColumn ?? 'unknown';
    return { outcome, engineVersion, format: 0 };
  }
  if (format === 1) {
    const v1 = raw as StoredAnalysisV1;
    if (!v1.result.ok) return { outcome: { ok: false, error: v1.result.error }, engineVersion: v1.engineVersion, format: 1 };
    const compact = v1.result.analysis;
    const analysis: Analysis = { ...compact, ...toDisplay(compact.si, compact.unitSystem) };
    return { outcome: { ok: true, analysis }, engineVersion: v1.engineVersion, format: 1 };
  }
  // written by a newer server (say, during a rolling upgrade): never guess at its numbers
  return {
    outcome: unreadable(`This analysis was stored in format ${String(format)} by a newer Headroom; this server reads formats up to ${ANALYSIS_FORMAT}.`),
    engineVersion: (raw as { engineVersion?: string }).engineVersion ?? engineVersionColumn ?? 'unknown',
    format: typeof format === 'number' ? format : -1,
  };
}
