import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ENGINE_VERSION } from '../../src/engine';
import { analyse } from '../../server/services/systems';
import {
  ANALYSIS_FORMAT,
  DRAFT_ANALYSIS_FORMAT,
  analyseParsed,
  readStoredAnalysis,
  readStoredVerdict,
  toStoredAnalysis,
  toStoredDraftAnalysis,
  verdictOf,
} from '../../server/services/storedAnalysis';
import { SystemDocumentSchema } from '../../src/engine';
import type { AnalysisOutcome } from '../../src/shared/api/systems';
import fixture from './fixtures/stored-analysis-format0.json';

// Exact comparisons throughout: a stored analysis is read back bit for bit, never recomputed.
const examples = ['alder-finch-cold.json', 'alder-finch-hot.json', 'small-house.json'];
const example = (name: string) => JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../src/engine/examples', name), 'utf8'));
/** what goes into the jsonb column and comes back out (key order aside, which jsonb does not keep) */
const throughJsonb = <T>(v: T): T => JSON.parse(JSON.stringify(v));

describe('a stored analysis of the form written before formats (format 0, committed fixture)', () => {
  it('when a computed one is read, then every number is as stored and the engine version is its own', () => {
    const read = readStoredAnalysis(fixture.computed.stored, 'column-version-not-used');
    expect(read.format).toBe(0);
    expect(read.outcome).toStrictEqual(fixture.computed.stored);
    expect(read.engineVersion).toBe(fixture.engineVersion);
  });

  it('when one the engine could not compute is read, then its error is as stored and the version is the row’s', () => {
    const read = readStoredAnalysis(fixture.failed.stored, '0.1.9');
    expect(read.outcome).toStrictEqual(fixture.failed.stored);
    expect(read.outcome.ok).toBe(false);
    expect(read.engineVersion).toBe('0.1.9');
  });

  it('when it arrives as JSON text (a jsonb read as text), then it is read the same', () => {
    expect(readStoredAnalysis(JSON.stringify(fixture.computed.stored), null).outcome).toStrictEqual(fixture.computed.stored);
  });

  it('when it is written again in the current format, then reading it gives it back unchanged (its display copies are derived exactly)', () => {
    const stored = fixture.computed.stored as AnalysisOutcome;
    const again = readStoredAnalysis(throughJsonb(toStoredAnalysis(stored, fixture.engineVersion)), null);
    expect(again.format).toBe(ANALYSIS_FORMAT);
    expect(again.outcome).toStrictEqual(stored);
  });
});

describe('the current stored form (format 1)', () => {
  it.each(examples)('when the analysis of %s is stored and read, then it is the engine’s analysis exactly, and the stored form is smaller', (name) => {
    const outcome = analyse(example(name));
    expect(outcome.ok).toBe(true);
    const stored = throughJsonb(toStoredAnalysis(outcome, ENGINE_VERSION));
    expect(stored.analysisFormat).toBe(ANALYSIS_FORMAT);
    // no display copy is stored: it is derived from the SI results on reading
    expect(Object.keys((stored.result as { analysis: object }).analysis)).not.toContain('segments');
    const read = readStoredAnalysis(stored, null);
    expect(read.outcome).toStrictEqual(throughJsonb(outcome));
    expect(read.engineVersion).toBe(ENGINE_VERSION);
    const before = JSON.stringify(outcome).length;
    const after = JSON.stringify(stored).length;
    console.log(`${name}: stored analysis ${(before / 1000).toFixed(1)} kB before formats, ${(after / 1000).toFixed(1)} kB in format ${ANALYSIS_FORMAT}`);
    expect(after).toBeLessThan(before);
  });

  it('when the engine could not compute the document, then its error is stored and read back as it was', () => {
    const doc = example('small-house.json');
    doc.segments[0].from = 'no-such-node';
    const outcome = analyse(doc);
    expect(outcome.ok).toBe(false);
    const read = readStoredAnalysis(throughJsonb(toStoredAnalysis(outcome, ENGINE_VERSION)), null);
    expect(read.outcome).toStrictEqual(throughJsonb(outcome));
  });

  it('when a row holds a format this server does not know (a newer server wrote it), then no numbers are guessed: it reads as not analysable, naming the format', () => {
    const read = readStoredAnalysis({ analysisFormat: DRAFT_ANALYSIS_FORMAT + 1, engineVersion: '9.9.9', result: { whatever: true } }, ENGINE_VERSION);
    expect(read.outcome.ok).toBe(false);
    expect(!read.outcome.ok && read.outcome.error.message).toContain(`format ${DRAFT_ANALYSIS_FORMAT + 1}`);
    expect(read.engineVersion).toBe('9.9.9');
  });

  it('when a row holds no analysis at all, then it reads as not analysed', () => {
    const read = readStoredAnalysis(null, ENGINE_VERSION);
    expect(read.outcome.ok).toBe(false);
  });
});

describe('a draft’s stored analysis (format 2: its verdict; the analysis computed from its document on reading)', () => {
  it.each(examples)(
    'when %s is stored as a draft, then reading it with its stored document gives the analysis the save made, bit for bit, and the lists read the verdict as stored',
    (name) => {
      const document = SystemDocumentSchema.parse(example(name));
      // what the save does: the analysis of the document the body's reader returned …
      const saved = analyseParsed(document);
      const stored = throughJsonb(toStoredDraftAnalysis(saved, ENGINE_VERSION));
      expect(stored).toEqual({ analysisFormat: DRAFT_ANALYSIS_FORMAT, engineVersion: ENGINE_VERSION, verdict: verdictOf(saved) });
      // … and what a read does: the document as jsonb gives it back
      const read = readStoredAnalysis(stored, 'column', throughJsonb(document));
      expect(read.format).toBe(DRAFT_ANALYSIS_FORMAT);
      expect(read.engineVersion).toBe(ENGINE_VERSION);
      expect(throughJsonb(read.outcome)).toStrictEqual(throughJsonb(saved));
      expect(readStoredVerdict(stored, 'column')).toEqual({ verdict: verdictOf(saved), engineVersion: ENGINE_VERSION, format: DRAFT_ANALYSIS_FORMAT });
    },
  );

  it('when a stored issued analysis (format 1) is listed, then its verdict is the one of the analysis it holds', () => {
    const outcome = analyse(example('small-house.json'));
    const stored = throughJsonb(toStoredAnalysis(outcome, ENGINE_VERSION));
    expect(readStoredVerdict(stored, null)).toEqual({ verdict: verdictOf(outcome), engineVersion: ENGINE_VERSION, format: ANALYSIS_FORMAT });
  });

  it('when a draft’s document cannot be computed, then the read answers the engine’s error and the verdict says it was not analysed', () => {
    const doc = example('small-house.json');
    doc.segments[0].from = 'no-such-node';
    const outcome = analyse(doc);
    const stored = throughJsonb(toStoredDraftAnalysis(outcome, ENGINE_VERSION));
    expect(stored.verdict).toMatchObject({ ok: false, status: null });
    const read = readStoredAnalysis(stored, null, doc);
    expect(read.outcome).toStrictEqual(throughJsonb(outcome));
  });
});
