/**
 * Timing of the summary PDF (for `npm run bench`): medians over repeated runs for the demo
 * building, a 200-segment generated system, and a one-page pdf-lib document with the same two
 * embedded fonts (the floor: what any summary costs before its content).
 */
import fs from 'node:fs';
import { PDFDocument } from 'pdf-lib';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import { generateBuilding } from '../../src/engine/testing/generateTree';
import { embedFonts } from './fonts';
import { renderSummaryPdf } from './summaryPdf';
import type { SummaryHeader } from '../../src/shared/api/summaries';

const HEADER: SummaryHeader = {
  projectName: 'Alder & Finch',
  address: '410 Quarry Lane, Wrenmoor',
  codeBasis: 'Benchmark (invented)',
  systemName: 'Benchmark system',
  revisionNumber: 1,
  issuedAt: '2026-12-01T12:00:00.000Z',
  preparerName: 'Benchmark',
  preparerEmail: '',
  inputHash: '0'.repeat(64),
  note: null,
};

/** The generated building (2 storeys × 4 apartments, 250 segments) cut to 200 by dropping unchecked fixture branches. */
export function twoHundredSegmentDocument() {
  const doc = generateBuilding({ storeys: 2, apartmentsPerStorey: 4 });
  const checked = new Set(doc.nodes.filter((n) => (n.checkedFixtures ?? []).length > 0).map((n) => n.id));
  const drop = new Set(
    doc.segments
      .filter((s) => s.id.startsWith('fb-') && !checked.has(s.to))
      .slice(0, doc.segments.length - 200)
      .map((s) => s.id),
  );
  const dropNodes = new Set(doc.segments.filter((s) => drop.has(s.id)).map((s) => s.to));
  return SystemDocumentSchema.parse({ ...doc, segments: doc.segments.filter((s) => !drop.has(s.id)), nodes: doc.nodes.filter((n) => !dropNodes.has(n.id)) });
}

async function median(runs: number, fn: () => Promise<unknown>): Promise<number> {
  await fn(); // warm-up (JIT, font bytes read once)
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

export interface PdfBenchResult {
  name: string;
  segments: number;
  pages: number;
  bytes: number;
  medianMs: number;
}

export async function benchSummaryPdf(runs = 9): Promise<PdfBenchResult[]> {
  const demoFile = new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url);
  const cases = [
    { name: 'demo building (Alder & Finch cold)', document: SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(demoFile, 'utf8'))) },
    { name: '200-segment generated system', document: twoHundredSegmentDocument() },
  ];
  const results: PdfBenchResult[] = [];
  {
    let bytes = 0;
    const ms = await median(runs, async () => {
      const doc = await PDFDocument.create({ updateMetadata: false });
      const fonts = await embedFonts(doc);
      doc.addPage([612, 792]).drawText('Headroom', { x: 50, y: 700, size: 12, font: fonts.regular });
      bytes = (await doc.save({ objectsPerTick: Number.POSITIVE_INFINITY })).length;
    });
    results.push({ name: 'floor: one page, two embedded fonts', segments: 0, pages: 1, bytes, medianMs: ms });
  }
  for (const c of cases) {
    const analysis = analyzeSystem(c.document);
    let pages = 0;
    let bytes = 0;
    const ms = await median(runs, async () => {
      const r = await renderSummaryPdf({ header: { ...HEADER, systemName: c.document.name }, document: c.document, analysis });
      pages = r.pageCount;
      bytes = r.bytes.length;
    });
    results.push({ name: c.name, segments: c.document.segments.length, pages, bytes, medianMs: ms });
  }
  return results;
}
