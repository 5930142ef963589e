/**
 * The demo seed's design variants (seeds/variants/demoVariants.ts, invented scenario): each is what
 * the seed says it is, checked by the engine here rather than by numbers written in the test.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema, sizingBasisState, sizingBasisText } from '../../src/engine';
import { example, hotFedFromColdDocument, sizedColdDocument, TOWER_STOREYS, zonedTowerDocument } from '../../seeds/variants/demoVariants';

describe('demo variants', () => {
  it('when the demo cold system is sized, then it passes, its sizes are the sizing’s and the basis says so', () => {
    const doc = sizedColdDocument();
    const a = analyzeSystem(doc);
    expect(a.verdict.status).toBe('pass');
    expect(sizingBasisState(doc)).toMatchObject({ kind: 'sized', edited: false });
    expect(doc.sizingBasis!.segmentsChanged).toBeGreaterThan(0);
    // every fixture keeps the 2 psi margin asked for (relative to the record, not a number written here)
    for (const f of a.fixtures) expect(f.margin).toBeGreaterThanOrEqual(doc.sizingBasis!.margin - 1e-9);
    expect(sizingBasisText(doc)).toContain('plus a margin of 2.00 psi');
  });

  it('when the tower study is built, then it has a PRV zone, a supply zone and a booster zone over its floors, and passes', () => {
    const doc = zonedTowerDocument();
    const a = analyzeSystem(doc);
    expect(doc.floors).toHaveLength(TOWER_STOREYS);
    expect((a.zones ?? []).map((z) => z.feed.kind).sort()).toEqual(['booster-pump', 'prv', 'supply']);
    expect(a.verdict.status).toBe('pass');
    expect(a.warnings.map((w) => w.code)).not.toContain('pex-metal-fittings');
    expect(sizingBasisState(doc)).toMatchObject({ kind: 'sized', edited: false });
  });

  it('when the hot system is fed from the cold one, then it names a node of the cold system feeding the heater', () => {
    const cold = SystemDocumentSchema.parse(example('alder-finch-cold.json'));
    const hot = hotFedFromColdDocument('cold-system-id');
    expect(hot.source.fedFrom).toEqual({ systemId: 'cold-system-id', nodeId: 'heater-feed' });
    expect(cold.nodes.some((n) => n.id === hot.source.fedFrom!.nodeId)).toBe(true);
    expect(SystemDocumentSchema.parse(hot)).toEqual(hot);
  });

  it('when the demo examples are analysed, then no PEX segment carries a metal fitting type', () => {
    for (const name of ['alder-finch-cold.json', 'alder-finch-hot.json']) {
      const a = analyzeSystem(SystemDocumentSchema.parse(example(name)));
      expect(a.warnings.map((w) => w.code)).not.toContain('pex-metal-fittings');
      expect(a.verdict.status).toBe('pass');
    }
  });
});
