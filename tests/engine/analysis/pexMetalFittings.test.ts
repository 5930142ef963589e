import { describe, expect, it } from 'vitest';
import { analyzeSystem, safeAnalyzeSystem } from '../../../src/engine';
import { clone, oneSegment, smallTree } from '../support/docs';

const pexWarnings = (doc: unknown) => analyzeSystem(doc).warnings.filter((w) => w.code === 'pex-metal-fittings');

describe('a PEX segment still carrying metal-pipe fittings', () => {
  it('when PEX segments carry metal elbows or tees, then one caution names every such segment and the types', () => {
    const doc = clone(smallTree());
    doc.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 1 }]; // copper: not flagged
    const [w] = pexWarnings(doc);
    expect(w.severity).toBe('caution');
    expect(w.elementType).toBe('segment');
    expect(w.elementIds).toEqual(['sc', 'sd']);
    expect(w.detail).toMatch(/^sc, sd: /);
    expect(w.detail).toContain('Elbow, 90°, standard');
    expect(w.detail).toContain('Tee, flow through branch');
    expect(pexWarnings(doc)).toHaveLength(1);
  });

  it('when the PEX segments carry PEX fittings, valves or their own data, then there is no caution', () => {
    const doc = clone(smallTree());
    doc.segments[2].fittings = [
      { typeId: 'pex-press-bronze-elbow-90', count: 2 },
      { typeId: 'valve-ball-full-port', count: 1 },
    ];
    doc.segments[3].fittings = [{ typeId: 'project:tee', count: 1, custom: { label: 'Our tee', equivalentLength: 2, source: 'maker sheet' } }];
    expect(pexWarnings(doc)).toEqual([]);
  });

  it('when a copper segment carries metal fittings, then there is no caution', () => {
    expect(pexWarnings(oneSegment())).toEqual([]);
  });

  it('when a segment changes from copper to PEX keeping its fittings, then it is named', () => {
    const doc = clone(oneSegment());
    doc.segments[0].material = 'pex-sdr9';
    const [w] = pexWarnings(doc);
    expect(w.elementIds).toEqual(['s1']);
  });

  it('when a PEX fitting type is used at a size its published table does not cover, then the error names the segment and the fitting, not a raw range error', () => {
    // the maker's PEX insert table stops at 1 in (REFERENCES §13g: Viega PEX Installation Manual §10.2)
    const doc = clone(smallTree());
    const seg = doc.segments[2];
    seg.material = 'pex-sdr9';
    seg.size = '1-1/4';
    seg.fittings = [{ typeId: 'pex-insert-brass-elbow-90', count: 1 }];
    const r = safeAnalyzeSystem(doc);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe('unknown-catalog-entry');
    expect(r.error.elementType).toBe('fitting');
    expect(r.error.elementId).toBe(seg.id);
    expect(r.error.field).toBe('typeId');
    expect(r.error.message).toContain('1-1/4');
  });
});
