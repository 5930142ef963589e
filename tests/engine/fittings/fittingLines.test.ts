import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../../src/engine';
import { COPPER_LINES, copperFittingFor, FITTING_TYPES, fittingK, PEX_LINES, pexFittingFor, publishedAtSize } from '../../../src/engine/fittings';
import { clone, oneSegment, smallTree } from '../support/docs';

const METAL_JOBS = {
  'elbow-90-standard': 'elbow-90',
  'elbow-90-long-radius': 'elbow-90',
  // no 45° row in the PEX or push-fit data: the line's 90° elbow, the larger loss
  'elbow-45-standard': 'elbow-90',
  'tee-run': 'tee-run',
  'tee-branch': 'tee-branch',
  coupling: 'coupling',
} as const;
const KEPT = ['valve-ball-full-port', 'valve-gate', 'entrance-sharp', 'exit', 'pex-press-bronze-elbow-90', 'push-brass-elbow-90'];
const pexWarnings = (doc: unknown) => analyzeSystem(doc).warnings.filter((w) => w.code === 'pex-metal-fittings');

describe('copper → PEX: each metal fitting becomes the same job in the PEX line installed', () => {
  it('every line maps every metal elbow, tee and coupling, and keeps valves, entrances, exits and other lines', () => {
    for (const { id: line } of PEX_LINES) {
      for (const [metal, job] of Object.entries(METAL_JOBS)) expect(pexFittingFor(metal, line)).toBe(`pex-${line}-${job}`);
      for (const id of KEPT) expect(pexFittingFor(id, line), id).toBeUndefined();
    }
  });

  it('given the segment size, a line that publishes nothing at that size maps nothing (the insert lines stop at 1 in)', () => {
    expect(pexFittingFor('elbow-90-standard', 'insert-brass', '1')).toBe('pex-insert-brass-elbow-90');
    expect(pexFittingFor('elbow-90-standard', 'insert-brass', '1-1/4')).toBeUndefined();
    expect(pexFittingFor('tee-branch', 'press-bronze', '2')).toBe('pex-press-bronze-tee-branch');
  });

  it('the PEX lines offered are the four with published values; no cold-expansion line (none was found)', () => {
    expect(PEX_LINES.map((l) => l.id)).toEqual(['insert-brass', 'insert-polymer', 'press-bronze', 'press-polymer']);
  });
});

describe('copper kept, soldered → push-to-connect', () => {
  it('the copper line offered is the push-fit brass line, labelled with the one size published', () => {
    expect(COPPER_LINES).toEqual([{ id: 'push-brass', label: 'Push-to-connect fitting (lead-free brass), 3/4 in (the size tested)' }]);
  });

  it('elbows (45° and 90°) become the push elbow and couplings the push coupling; tees and valves are kept', () => {
    for (const metal of ['elbow-90-standard', 'elbow-90-long-radius', 'elbow-45-standard'])
      expect(copperFittingFor(metal, 'push-brass')).toBe('push-brass-elbow-90');
    expect(copperFittingFor('coupling', 'push-brass')).toBe('push-brass-coupling');
    for (const id of ['tee-run', 'tee-branch', ...KEPT]) expect(copperFittingFor(id, 'push-brass'), id).toBeUndefined();
  });

  it('only at 3/4, the size NIST tested', () => {
    expect(copperFittingFor('elbow-90-standard', 'push-brass', '3/4')).toBe('push-brass-elbow-90');
    for (const size of ['1/2', '1', '2']) expect(copperFittingFor('elbow-90-standard', 'push-brass', size), size).toBeUndefined();
    expect(publishedAtSize(FITTING_TYPES['push-brass-coupling'], '3/4')).toBe(true);
    expect(publishedAtSize(FITTING_TYPES['push-brass-coupling'], '1')).toBe(false);
    expect(publishedAtSize(FITTING_TYPES['elbow-90-standard'], '1')).toBe(true);
  });

  it('the 45° elbow’s replacement is the larger loss at 3/4 (the substitution does not flatter the result)', () => {
    // 3/4 type L copper, ID 0.785 in (ASTM B88, REFERENCES §5a); Re 3e4 and f 0.024, a typical branch (common practice)
    const ctx = { method: 'crane' as const, innerDiameterM: 0.785 * 0.0254, nominalSizeIn: 0.75, nominalSizeKey: '3/4', Re: 3e4, frictionFactor: 0.024 };
    expect(fittingK('push-brass-elbow-90', ctx).K).toBeGreaterThan(fittingK('elbow-45-standard', ctx).K);
  });

  it('a 3/4 copper segment changed to push fittings is computed, keeps its tee and carries no PEX caution', () => {
    const doc = clone(oneSegment());
    const seg = doc.segments[0];
    seg.fittings = [
      { typeId: 'elbow-90-standard', count: 2 },
      { typeId: 'coupling', count: 1 },
      { typeId: 'tee-run', count: 1 },
    ];
    seg.fittings = seg.fittings.map((f) => ({ ...f, typeId: copperFittingFor(f.typeId, 'push-brass', seg.size) ?? f.typeId }));
    expect(seg.fittings.map((f) => f.typeId)).toEqual(['push-brass-elbow-90', 'push-brass-coupling', 'tee-run']);
    const a = analyzeSystem(doc);
    expect(a.si.segments[0].fittingLoss).toBeGreaterThan(0);
    expect(a.warnings.map((w) => w.code)).not.toContain('pex-metal-fittings');
  });
});

describe('the caution on a PEX segment still carrying metal-pipe fittings', () => {
  it('still names the PEX segments that keep their metal elbows and tees, and goes once the PEX line replaces them', () => {
    const doc = clone(smallTree());
    const [before] = pexWarnings(doc);
    expect(before.elementIds).toEqual(['sc', 'sd']);
    for (const s of doc.segments.filter((x) => x.material === 'pex-sdr9')) {
      s.fittings = (s.fittings ?? []).map((f) => ({ ...f, typeId: pexFittingFor(f.typeId, 'press-bronze', s.size) ?? f.typeId }));
    }
    expect(doc.segments.find((s) => s.id === 'sc')!.fittings?.[0].typeId).toBe('pex-press-bronze-elbow-90');
    expect(pexWarnings(doc)).toEqual([]);
  });

  it('is not raised by push-to-connect fittings on PEX (they are made for copper tube and plastic pipe alike)', () => {
    const doc = clone(smallTree());
    doc.segments.find((s) => s.id === 'sc')!.fittings = [{ typeId: 'push-brass-elbow-90', count: 1 }];
    const [w] = pexWarnings(doc);
    expect(w.elementIds).toEqual(['sd']);
  });
});
