/**
 * PDF rows: the issued summary of the demo building and of a 200-segment system, against a
 * one-page pdf-lib document with the same two embedded fonts (the floor: what any summary costs
 * before its content). The timing itself is server/pdf/bench.ts.
 */
import { benchSummaryPdf } from '../../server/pdf/bench';
import type { BenchRow } from './table';

export async function pdfRows(runs: number): Promise<BenchRow[]> {
  const results = await benchSummaryPdf(runs);
  const floor = results.find((r) => r.segments === 0);
  if (!floor) throw new Error('server/pdf/bench.ts gave no floor row');
  return results
    .filter((r) => r.segments > 0)
    .map((r) => ({
      figure: `PDF: ${r.name}, ${r.segments} segments, ${r.pages} pages`,
      unit: 'ms' as const,
      median: r.medianMs,
      runs,
      peer: { name: 'one-page pdf-lib document, same two fonts', median: floor.medianMs },
      // the aim of issue #7 for the 200-segment summary
      aim: r.segments === 200 ? '< 300 ms' : undefined,
    }));
}
