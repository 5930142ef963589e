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
 *
 * Format 2 is a draft's: its verdict only (what the lists show). A draft's analysis is a pure
 * function of its document and the engine, so it is computed again when it is read (through a
 * small cache keyed by the document's content) instead of being written with every save. Issuing
 * writes format 1 (the database's issue rules find no outcome in a format 2 value, so a draft can
 * never be issued without its whole analysis).
 */
import { createHash } from 'node:crypto';
import { ENGINE_VERSION, safeAnalyzeSystem, toDisplay, verdictStatus, type Analysis, type EngineInputErrorJSON, type SystemDocument } from '../../src/engine';
import { analyzeValidated } from '../../src/engine/analysis/analyze';
import type { AnalysisOutcome, RevisionVerdict } from '../../src/shared/api/systems';

/** The format of an analysis kept for good (issued revisions). Raise it (and add a reader of the old one below) when the stored form changes. */
export const ANALYSIS_FORMAT = 1;
/** The format of a draft's stored analysis: its verdict only. */
export const DRAFT_ANALYSIS_FORMAT = 2;

/** The server's analysis of a document: exactly what the engine returns, errors as their JSON. */
export function analyse(document: unknown): AnalysisOutcome {
  const result = safeAnalyzeSystem(document);
  return result.ok ? { ok: true as const, analysis: result.analysis } : { ok: false as const, error: result.error.toJSON() };
}

/**
 * The same for a document the schema's reader has just returned (the save route's body): the
 * engine does not read it a second time. An input error is reported by `analyse`, whose answer it is.
 */
export function analyseParsed(document: SystemDocument): AnalysisOutcome {
  try {
    return { ok: true, analysis: analyzeValidated(document) };
  } catch {
    return analyse(document);
  }
}

/** What the lists show of an analysis. */
export function verdictOf(a: AnalysisOutcome): RevisionVerdict {
  if (!a.ok)
    return {
      ok: false,
      status: null,
      allPass: null,
      criticalFixtureId: null,
      criticalMargin: null,
      warningCount: 0,
      errorMessage: a.error.message ?? 'Not analysed',
    };
  const critical = a.analysis.fixtures.find((f) => f.id === a.analysis.criticalFixtureId);
  const status = verdictStatus(a.analysis);
  return {
    ok: true,
    status,
    allPass: status === 'pass',
    criticalFixtureId: a.analysis.criticalFixtureId,
    criticalMargin: critical?.margin ?? null,
    warningCount: a.analysis.warnings.length,
    errorMessage: null,
  };
}

/** The verdict of a stored analysis, or "not analysed" when the stored value is not an analysis this server can read. */
export function safeVerdictOf(outcome: AnalysisOutcome): RevisionVerdict {
  try {
    return verdictOf(outcome);
  } catch {
    return verdictOf(unreadable('The stored analysis cannot be read'));
  }
}

/**
 * Drafts' analyses computed on reading, by the content of the document (the SHA-1 of its JSON):
 * a draft read again unchanged (the walk opening it, a hot-water system reading its cold supply)
 * is not analysed again. At most 16 entries and 4 MB of document JSON, least recently used out
 * first (choices: a handful of designers' open drafts per process; an analysis takes a few times
 * its document's size in memory, so the cache stays in the tens of megabytes even for the largest
 * documents, and one over 1 MB is not kept).
 */
const CACHE_ENTRIES = 16;
const CACHE_DOCUMENT_BYTES = 4_000_000;
const computed = new Map<string, { outcome: AnalysisOutcome; bytes: number }>();
let cachedBytes = 0;

function analysisOfDocument(document: unknown): AnalysisOutcome {
  const text = JSON.stringify(document);
  const key = createHash('sha1').update(text).digest('base64');
  const hit = computed.get(key);
  if (hit) {
    computed.delete(key);
    computed.set(key, hit);
    return hit.outcome;
  }
  const outcome = analyse(document);
  if (text.length <= CACHE_DOCUMENT_BYTES / 4) {
    computed.set(key, { outcome, bytes: text.length });
    cachedBytes += text.length;
    while (computed.size > CACHE_ENTRIES || cachedBytes > CACHE_DOCUMENT_BYTES) {
      const [oldest, entry] = computed.entries().next().value!;
      computed.delete(oldest);
      cachedBytes -= entry.bytes;
    }
  }
  return outcome;
}

/** Format 2, as stored in `revisions.analysis` for a draft. */
export interface StoredDraftAnalysisV2 {
  analysisFormat: 2;
  /** the engine version that made the verdict (also in the `engine_version` column) */
  engineVersion: string;
  verdict: RevisionVerdict;
}

/** The stored form of a draft's analysis (format DRAFT_ANALYSIS_FORMAT): the verdict of `outcome`, made from the document the draft stores. */
export function toStoredDraftAnalysis(outcome: AnalysisOutcome, engineVersion: string): StoredDraftAnalysisV2 {
  return { analysisFormat: 2, engineVersion, verdict: verdictOf(outcome) };
}

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
 * not be computed (a computed one names its engine itself). A draft's (format 2) is computed from
 * `document`, the document the row stores, by this server's engine.
 */
export function readStoredAnalysis(stored: unknown, engineVersionColumn: string | null, document?: unknown): ReadAnalysis {
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
  if (format === 2) {
    if (document === undefined) return { outcome: unreadable('Not analysed'), engineVersion: ENGINE_VERSION, format: 2 };
    return { outcome: analysisOfDocument(document), engineVersion: ENGINE_VERSION, format: 2 };
  }
  // written by a newer server (say, during a rolling upgrade): never guess at its numbers
  return {
    outcome: unreadable(`This analysis was stored in format ${String(format)} by a newer Headroom; this server reads formats up to ${DRAFT_ANALYSIS_FORMAT}.`),
    engineVersion: (raw as { engineVersion?: string }).engineVersion ?? engineVersionColumn ?? 'unknown',
    format: typeof format === 'number' ? format : -1,
  };
}

/**
 * The verdict of a stored analysis without computing anything: a draft's (format 2) as stored, an
 * issued revision's from its stored analysis. What the lists of revisions show.
 */
export function readStoredVerdict(stored: unknown, engineVersionColumn: string | null): { verdict: RevisionVerdict; engineVersion: string; format: number } {
  const raw = typeof stored === 'string' ? (JSON.parse(stored) as unknown) : stored;
  if (raw !== null && typeof raw === 'object' && (raw as { analysisFormat?: unknown }).analysisFormat === 2) {
    const v2 = raw as StoredDraftAnalysisV2;
    return { verdict: v2.verdict, engineVersion: v2.engineVersion, format: 2 };
  }
  const read = readStoredAnalysis(raw, engineVersionColumn);
  return { verdict: safeVerdictOf(read.outcome), engineVersion: read.engineVersion, format: read.format };
}
