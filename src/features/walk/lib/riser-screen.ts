/**
 * The riser diagram for the screen: the same layout as the issued summary's PDF
 * (src/shared/diagram/riserLayout.ts), laid out on one sheet and turned from PDF points (y up)
 * into SVG units (y down). One SVG unit is one point of the printed sheet.
 */
import type { Analysis, SystemDocument } from '../../../engine';
import { CHAR_EM, fitRiserDiagram, oneSheetArea, riserDiagram, type DrawItem, type PaperArea, type RiserDiagram } from '../../../shared/diagram/riserLayout';

/**
 * The base sheet: US Letter inside the summary's margins (612 × 792 pt less 50 pt sides, 60 pt
 * bottom, 100 pt top), as the PDF draws it; a larger diagram gets a larger sheet, never tiles.
 */
export const BASE_SHEET = { width: 512, height: 632 } as const;

export interface ScreenDrawing {
  diagram: RiserDiagram;
  area: PaperArea;
  items: DrawItem[];
}

export function screenDrawing(document: SystemDocument, analysis: Analysis): ScreenDrawing {
  const diagram = riserDiagram(document, analysis);
  const area = oneSheetArea(diagram, BASE_SHEET);
  const sheets = fitRiserDiagram(diagram, area);
  return { diagram, area, items: sheets[0]?.items ?? [] };
}

/** SVG y (down) of a PDF y (up) on the area. */
export const svgY = (area: PaperArea, y: number) => area.bottom + area.height - y;

/** A text shortened with an ellipsis to fit `maxWidth` by the layout's width bound (the PDF does the same by measuring). */
export function fitText(text: string, size: number, maxWidth: number): string {
  const chars = Math.floor(maxWidth / (size * CHAR_EM));
  if (text.length <= chars) return text;
  return chars <= 1 ? '' : `${text.slice(0, chars - 1)}…`;
}
