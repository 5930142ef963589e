/**
 * The record of an applied sizing (the document's `sizingBasis`) and its wording: what it records
 * comes from the sizing's own analysis, a later edit of a pipe is noticed, the record survives the
 * schema, the fast reader and a unit switch. Consistency checks of Headroom's own record (no
 * published values); the figures compared are computed by the engine in the test.
 */
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema, type SystemDocument } from '../../../src/engine';
import { convertDocumentUnits } from '../../../src/engine/building/convertUnits';
import { fastParseSystemDocument } from '../../../src/engine/model/fastParse';
import { sizesFingerprint, sizingBasisOf, sizingBasisState, sizingBasisText } from '../../../src/engine/sizing/basis';
import { sizeSystem } from '../../../src/engine/sizing/sizeSystem';
import { PA_PER_PSI } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';

const demo = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));

function sizedDemo(marginPsi: number) {
  const doc = demo();
  // lock the first sized segment so the record has a lock to count
  const lockedId = doc.segments.find((s) => s.material && s.size)!.id;
  doc.segments = doc.segments.map((s) => (s.id === lockedId ? { ...s, sizeLocked: true } : s));
  const marginPa = marginPsi * PA_PER_PSI;
  const result = sizeSystem(doc, { marginPa });
  expect(result.feasible).toBe(true);
  const sized = result.document!;
  const at = new Date('2026-11-30T09:15:00Z');
  return { doc, sized: { ...sized, sizingBasis: sizingBasisOf({ sized, result, marginPa, scope: 'system', at }) }, result, lockedId };
}

describe('sizing basis', () => {
  it('when a sizing is applied, then the record holds the margin, the supply pressure and the limits the analysis used, in the document units', () => {
    const { doc, sized, result } = sizedDemo(2);
    const b = sized.sizingBasis!;
    const before = analyzeSystem(doc);
    // relative 1e-9: a unit round trip (psi → Pa → psi) of the same number
    expectClose(b.margin, 2, { rtol: 1e-9 });
    expectClose(b.supplyPressure, before.source.pressureAtDesignFlow, { rtol: 1e-9 });
    const limits = before.criteria.velocityLimits.filter((v) => v.service === doc.service);
    expect(b.velocityLimits.map((v) => v.material)).toEqual(limits.map((v) => v.material));
    b.velocityLimits.forEach((v, i) => expectClose(v.maxVelocity, limits[i].maxVelocity, { rtol: 1e-9 }));
    expect(b.segmentsChanged).toBe(result.segments.filter((r) => r.after !== r.before).length);
    expect(b.segmentsLocked).toBe(1);
    expect(b.sizedAt).toBe('2026-11-30T09:15:00.000Z');
  });

  it('when the sizes are as the sizing left them, then the summary says so; when a size is edited after, then it says they may have changed', () => {
    const { sized } = sizedDemo(0);
    expect(sizingBasisState(sized)).toMatchObject({ kind: 'sized', edited: false });
    const text = sizingBasisText(sized);
    expect(text).toContain("Sizes chosen by Headroom's automatic sizing on 2026-11-30 09:15 UTC, for the whole system");
    expect(text).toContain('plus a margin of 0.00 psi');
    expect(text).toContain(`${sized.sizingBasis!.supplyPressure.toFixed(2)} psi at the design flow`);
    expect(text).toContain('1 segment was kept at its locked size');
    expect(text).not.toContain('edited since');

    const target = sized.segments.find((s) => s.material === 'copper-l' && s.size !== '2')!;
    const edited = { ...sized, segments: sized.segments.map((s) => (s.id === target.id ? { ...s, size: '2' } : s)) };
    expect(sizingBasisState(edited)).toMatchObject({ kind: 'sized', edited: true });
    expect(sizingBasisText(edited)).toContain('edited since that sizing');

    // a change that is not a pipe (a label) is not an edit of the sizes
    const relabelled = { ...sized, segments: sized.segments.map((s, i) => (i === 0 ? { ...s, label: 'renamed' } : s)) };
    expect(sizingBasisState(relabelled)).toMatchObject({ edited: false });
  });

  it('when no sizing is recorded, then the sizes are the designer’s', () => {
    expect(sizingBasisState(demo())).toEqual({ kind: 'as-entered' });
    expect(sizingBasisText(demo())).toMatch(/^Sizes as entered by the designer/);
  });

  it('when the document is read by the schema and by the fast reader, then both keep the record alike; a stray key is refused', () => {
    const { sized } = sizedDemo(1);
    const parsed = SystemDocumentSchema.parse(sized);
    expect(fastParseSystemDocument(sized)).toEqual(parsed);
    expect(parsed.sizingBasis).toEqual(sized.sizingBasis);
    const stray = { ...sized, sizingBasis: { ...sized.sizingBasis, by: 'someone' } };
    expect(SystemDocumentSchema.safeParse(stray).success).toBe(false);
    expect(fastParseSystemDocument(stray)).toBeUndefined();
    const negative = { ...sized, sizingBasis: { ...sized.sizingBasis!, segmentsChanged: -1 } };
    expect(SystemDocumentSchema.safeParse(negative).success).toBe(false);
  });

  it('when the project switches to SI, then the record is converted and still matches the sizes', () => {
    const { sized } = sizedDemo(2);
    const si = convertDocumentUnits(sized, 'SI');
    // 2 psi = 13.79 kPa (6.894757 kPa per psi, NIST SP 811), rounded to 0.1 kPa as the converter does
    expect(si.sizingBasis!.margin).toBe(13.8);
    expect(sizingBasisState(si)).toMatchObject({ kind: 'sized', edited: false });
    expect(sizingBasisText(si)).toContain('plus a margin of 13.80 kPa');
    expect(sizesFingerprint(si)).toBe(sized.sizingBasis!.sizesFingerprint);
  });
});
