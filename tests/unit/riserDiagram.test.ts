import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import { apartmentBuildingDocument } from '../../src/engine/building/apartmentBuilding';
import { fitRiserDiagram, itemBox, MIN_COLUMN_PT, riserDiagram, type PaperArea, type Sheet } from '../../src/shared/diagram/riserLayout';

// The riser diagram's page fit, by the bounding box of every drawn item (text by its width bound,
// which the PDF fits each text into). The demo (invented "Alder & Finch") and the generated
// 40-storey building of 8 apartments a floor (invented). The area is the US Letter page inside
// the summary's margins (612 × 792 pt less 50 pt sides, 60 pt bottom, 100 pt top with the heading).
const AREA: PaperArea = { left: 50, bottom: 60, width: 512, height: 632 };
const demo = () => SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
const hot = () => SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL('../../src/engine/examples/alder-finch-hot.json', import.meta.url), 'utf8')));
const tower = () => SystemDocumentSchema.parse(apartmentBuildingDocument(40, 8));

function expectInside(sheets: Sheet[]) {
  for (const sheet of sheets) {
    for (const item of sheet.items) {
      const b = itemBox(item);
      const what = `sheet ${sheet.number}: ${item.type === 'text' ? `"${item.text}"` : item.type}`;
      // 0.01 pt: rounding of the arithmetic only
      expect(b.x0, `${what} left`).toBeGreaterThanOrEqual(AREA.left - 0.01);
      expect(b.x1, `${what} right`).toBeLessThanOrEqual(AREA.left + AREA.width + 0.01);
      expect(b.y0, `${what} bottom`).toBeGreaterThanOrEqual(AREA.bottom - 0.01);
      expect(b.y1, `${what} top`).toBeLessThanOrEqual(AREA.bottom + AREA.height + 0.01);
    }
  }
}

describe('the riser diagram on paper', () => {
  it('when the demo is drawn, then it fits one sheet with every item inside the margins, its meter, backflow preventer, booster and PRVs tagged and its floors labelled', () => {
    const doc = demo();
    const d = riserDiagram(doc, analyzeSystem(doc));
    const sheets = fitRiserDiagram(d, AREA);
    expect(sheets).toHaveLength(1);
    expectInside(sheets);
    const tags = d.devices.map((x) => x.tag).sort();
    expect(tags).toEqual(['BFP', 'BP', 'M', 'PRV', 'PRV', 'PRV', 'PRV']);
    for (const dv of doc.devices) expect(d.devices.map((x) => x.label)).toContain(dv.label);
    const texts = sheets[0].items.filter((i) => i.type === 'text').map((i) => (i as { text: string }).text);
    for (const l of d.levels) expect(texts).toContain(l.name);
    // every segment is drawn, labelled with its size and material where there is room
    expect(d.pipes).toHaveLength(doc.segments.length);
    expect(texts.filter((t) => / Cu L$/.test(t)).length).toBeGreaterThan(5);
  });

  it('when the demo is drawn, then each zone boundary (its booster and PRVs) is marked in words at its device, inside the margins', () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    const d = riserDiagram(doc, a);
    // every zone but the supply's starts at a PRV or booster of the drawing
    const fed = a.zones!.filter((z) => z.feed.kind !== 'supply');
    expect(d.zones.map((z) => z.name)).toEqual(fed.map((z) => z.name));
    for (const z of d.zones) expect(z.at).toEqual(d.devices.find((dv) => dv.deviceId === z.zoneId)!.at);
    const sheets = fitRiserDiagram(d, AREA);
    expectInside(sheets);
    const items = sheets.flatMap((s) => s.items);
    const texts = items.filter((i) => i.type === 'text').map((i) => (i as { text: string }).text);
    for (const z of fed) expect(texts).toContain(`Zone ${z.index} starts`);
    expect(items.filter((i) => i.type === 'line' && i.weight === 'zone')).toHaveLength(fed.length);
  });

  it('when a system has one zone, then no boundary is drawn', () => {
    const doc = demo();
    doc.devices = doc.devices.filter((dv) => dv.kind !== 'prv' && dv.kind !== 'booster-pump');
    const d = riserDiagram(doc, analyzeSystem(doc));
    expect(d.zones).toEqual([]);
  });

  it('when the hot-water demo is drawn, then its water heater is tagged WH', () => {
    const doc = hot();
    const d = riserDiagram(doc, analyzeSystem(doc));
    expect(d.devices.find((x) => x.tag === 'WH')?.label).toMatch(/water heater/i);
    expectInside(fitRiserDiagram(d, AREA));
  });

  it('when the 40-storey building is drawn, then it is tiled with match lines naming the next sheet, every item stays inside, and every floor is labelled', () => {
    const doc = tower();
    const d = riserDiagram(doc, analyzeSystem(doc));
    expect(d.levels).toHaveLength(40);
    const sheets = fitRiserDiagram(d, AREA);
    expect(sheets.length).toBeGreaterThan(1);
    expectInside(sheets);
    const texts = sheets.flatMap((s) => s.items.filter((i) => i.type === 'text').map((i) => (i as { text: string }).text));
    for (let k = 1; k <= 40; k++) expect(texts.filter((t) => t === `Level ${k}`).length, `Level ${k}`).toBeGreaterThanOrEqual(1);
    for (const sheet of sheets) {
      const matches = sheet.items.filter((i) => i.type === 'text' && /^match line: continues on sheet \d+$/.test(i.text));
      expect(matches.length, `sheet ${sheet.number} has a match line`).toBeGreaterThan(0);
      for (const m of matches) {
        const n = Number((m as { text: string }).text.match(/\d+$/)![0]);
        expect(n).not.toBe(sheet.number);
        expect(n).toBeLessThanOrEqual(sheets.length);
      }
    }
    // legible: neighbouring drops of a tile stand at least the minimum column width apart
    const xs = [...new Set(sheets[0].items.filter((i) => i.type === 'line' && i.weight === 'pipe' && i.x1 === i.x2).map((i) => (i as { x1: number }).x1))].sort(
      (p, q) => p - q,
    );
    expect(xs.length).toBeGreaterThan(10);
    for (let k = 1; k < xs.length; k++) expect(xs[k] - xs[k - 1]).toBeGreaterThanOrEqual(MIN_COLUMN_PT - 0.01);
    expect(d.devices.map((x) => x.tag).sort()).toEqual(['BFP', 'M']);
  });
});

describe('the riser diagram levels', () => {
  it('when a hot system shares the building floors but stops below the roof, then the roof is not drawn as an empty level; the cold system that reaches it keeps it', () => {
    const h = hot();
    const c = demo();
    const hotLevels = riserDiagram(h, analyzeSystem(h)).levels.map((l) => l.name);
    const coldLevels = riserDiagram(c, analyzeSystem(c)).levels.map((l) => l.name);
    // Both documents name the same eight floors (Level 1 … Roof); only the cold one has nodes on the roof.
    expect(h.floors.map((f) => f.name)).toEqual(c.floors.map((f) => f.name));
    expect(coldLevels).toContain('Roof');
    expect(hotLevels).not.toContain('Roof');
    expect(hotLevels).toEqual(h.floors.map((f) => f.name).filter((n) => n !== 'Roof'));
  });
});
