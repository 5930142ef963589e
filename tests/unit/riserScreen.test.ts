import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import { apartmentBuildingDocument } from '../../src/engine/building/apartmentBuilding';
import { itemBox, MIN_COLUMN_PT, MIN_STOREY_PT } from '../../src/shared/diagram/riserLayout';
import { BASE_SHEET, fitText, screenDrawing } from '../../src/features/walk/lib/riser-screen';

// The screen's riser diagram: the shared layout on one sheet, never tiled; the sheet grows past
// the base (US Letter inside the summary's margins) only as the legibility floors require. The
// demo is the invented "Alder & Finch"; the tower a generated, invented 40-storey building.
const demo = () => SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
const tower = () => SystemDocumentSchema.parse(apartmentBuildingDocument(40, 8));

function expectInside(drawing: ReturnType<typeof screenDrawing>) {
  const { area, items } = drawing;
  for (const item of items) {
    const b = itemBox(item);
    const what = item.type === 'text' ? `"${item.text}"` : item.type;
    // 0.01 pt: rounding of the arithmetic only
    expect(b.x0, `${what} left`).toBeGreaterThanOrEqual(area.left - 0.01);
    expect(b.x1, `${what} right`).toBeLessThanOrEqual(area.left + area.width + 0.01);
    expect(b.y0, `${what} bottom`).toBeGreaterThanOrEqual(area.bottom - 0.01);
    expect(b.y1, `${what} top`).toBeLessThanOrEqual(area.bottom + area.height + 0.01);
  }
}

describe('the riser diagram on screen', () => {
  it('when the demo is drawn, then it keeps the base sheet, holds every item, and marks every checked fixture', () => {
    const doc = demo();
    const a = analyzeSystem(doc);
    const drawing = screenDrawing(doc, a);
    expect(drawing.area.width).toBe(BASE_SHEET.width);
    expect(drawing.area.height).toBe(BASE_SHEET.height);
    expectInside(drawing);
    const marked = drawing.items.flatMap((i) => (i.type === 'box' && i.fixtureId ? [i.fixtureId] : []));
    expect(marked.sort()).toEqual(a.fixtures.map((f) => f.id).sort());
  });

  it('when the 40-storey building is drawn, then it is one sheet, grown so that no column and no storey falls under the legibility floors, with every level named', () => {
    const doc = tower();
    const drawing = screenDrawing(doc, analyzeSystem(doc));
    const { diagram, area, items } = drawing;
    expect(area.height).toBeGreaterThan(BASE_SHEET.height);
    expectInside(drawing);
    const texts = items.flatMap((i) => (i.type === 'text' ? [i.text] : []));
    for (const l of diagram.levels) expect(texts).toContain(l.name);
    expect(texts.some((t) => t.startsWith('match line'))).toBe(false);
    const drops = [...new Set(items.filter((i) => i.type === 'line' && i.weight === 'pipe' && i.x1 === i.x2).map((i) => (i as { x1: number }).x1))].sort(
      (p, q) => p - q,
    );
    for (let k = 1; k < drops.length; k++) expect(drops[k] - drops[k - 1]).toBeGreaterThanOrEqual(MIN_COLUMN_PT - 0.01);
    const levels = [...new Set(items.filter((i) => i.type === 'line' && i.weight === 'level').map((i) => (i as { y1: number }).y1))].sort((p, q) => p - q);
    for (let k = 1; k < levels.length; k++) expect(levels[k] - levels[k - 1]).toBeGreaterThanOrEqual(MIN_STOREY_PT - 0.01);
    console.log(`40 storeys on screen: ${area.width.toFixed(0)} × ${area.height.toFixed(0)} pt, ${diagram.columns} columns`);
  });

  it('when a text is longer than its room, then it is shortened with an ellipsis within the width bound', () => {
    expect(fitText('Level 2 corridor header', 5, 1000)).toBe('Level 2 corridor header');
    const short = fitText('Level 2 corridor header', 5, 40);
    expect(short.endsWith('…')).toBe(true);
    expect(short.length * 5 * 0.62).toBeLessThanOrEqual(40);
    expect(fitText('Level 2', 5, 2)).toBe('');
  });
});
