// `npx tsx scripts/bench-pdf.ts`: medians of the issued-summary PDF generation (aim: < 300 ms for 200 segments).
import { benchSummaryPdf } from '../server/pdf/bench';

const runs = Number(process.argv[2] ?? 9);
for (const r of await benchSummaryPdf(runs)) {
  console.log(
    `${r.name.padEnd(40)} ${String(r.segments).padStart(4)} segments ${String(r.pages).padStart(3)} pages ${(r.bytes / 1024).toFixed(0).padStart(5)} kB  median ${r.medianMs.toFixed(0).padStart(5)} ms`,
  );
}
