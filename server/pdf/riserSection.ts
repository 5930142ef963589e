/**
 * Appendix: the riser diagram on paper, drawn as vectors from the shared layout
 * (src/shared/diagram/riserLayout.ts) — fitted to one page, or tiled across pages with match lines.
 */
import { degrees, type PDFFont } from 'pdf-lib';
import { DEVICE_TAG_WORDS, fitRiserDiagram, riserDiagram, type DeviceTag, type DrawItem } from '../../src/shared/diagram/riserLayout';
import { COLORS, type Layout } from './layout';
import type { SummaryContext } from './summaryPdf';

export function riserDiagramSection(c: SummaryContext) {
  const { L, doc, a } = c;
  const diagram = riserDiagram(doc, a);
  if (!diagram.pipes.length) return;
  if (!L.atPageTop) L.newPage();
  L.heading('Appendix: riser diagram');
  const tags = [...new Set(diagram.devices.map((d) => d.tag))] as DeviceTag[];
  L.paragraph(
    `Schematic, heights to scale (each node at its elevation, ${diagram.lengthUnit}); branches spread sideways. Each pipe is labelled with its nominal size and material; risers are drawn heavier; a small square is a checked fixture. Devices: ${tags.map((t) => `${t} ${DEVICE_TAG_WORDS[t]}`).join(', ') || 'none'}.`,
    { size: 8, color: COLORS.muted },
  );
  const firstTop = L.y - 14;
  const fullTop = L.height - 72 - 16;
  // every sheet gets the same area, so the tiles join: the smaller of the first page's and the others'
  const height = Math.min(firstTop, fullTop) - L.bottom;
  const sheets = fitRiserDiagram(diagram, { left: L.left, bottom: L.bottom, width: L.contentWidth, height });
  sheets.forEach((sheet, i) => {
    if (i > 0) L.newPage();
    L.draw(
      `Riser diagram, sheet ${sheet.number} of ${sheets.length}${sheets.length > 1 ? ` (row ${sheet.row + 1}, column ${sheet.column + 1})` : ''}`,
      L.left,
      L.bottom + height + 6,
      { font: 'bold', size: 8 },
    );
    for (const item of sheet.items) drawItem(L, item);
  });
  L.y = L.bottom;
}

function drawItem(L: Layout, item: DrawItem) {
  const page = L.page;
  if (item.type === 'line') {
    const style = {
      pipe: { thickness: 0.7, color: COLORS.ink },
      riser: { thickness: 1.5, color: COLORS.accent },
      level: { thickness: 0.35, color: COLORS.rule, dashArray: [3, 2] },
      match: { thickness: 0.9, color: COLORS.fail, dashArray: [6, 2, 1, 2] },
      zone: { thickness: 1.4, color: COLORS.ink, dashArray: [3, 1, 1, 1] },
    }[item.weight];
    page.drawLine({ start: { x: item.x1, y: item.y1 }, end: { x: item.x2, y: item.y2 }, ...style });
    return;
  }
  if (item.type === 'box') {
    page.drawRectangle({ x: item.x, y: item.y, width: item.width, height: item.height, color: COLORS.band, borderColor: COLORS.accent, borderWidth: 0.6 });
    return;
  }
  const font: PDFFont = item.bold ? L.fonts.bold : L.fonts.regular;
  const text = L.fit(L.clean(item.text, font), font, item.size, item.maxWidth);
  if (!text || item.maxWidth <= 0) return;
  page.drawText(text, { x: item.x, y: item.y, size: item.size, font, color: COLORS.ink, ...(item.vertical ? { rotate: degrees(90) } : {}) });
}
