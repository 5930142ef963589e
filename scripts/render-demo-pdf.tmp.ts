import fs from 'node:fs';
import { analyzeSystem, SystemDocumentSchema } from '../src/engine';
import { renderSummaryPdf } from '../server/pdf/summaryPdf';
const name = process.argv[2] ?? 'alder-finch-cold';
const doc = SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(`src/engine/examples/${name}.json`, 'utf8')));
const a = analyzeSystem(doc);
const t = performance.now();
const r = await renderSummaryPdf({
  header: { projectName: 'Alder & Finch', address: '410 Quarry Lane, Wrenmoor', codeBasis: 'x', systemName: doc.name, revisionNumber: 1, issuedAt: '2026-12-01T12:00:00.000Z', preparerName: 'Dana Whitlow', preparerEmail: '', inputHash: 'a'.repeat(64), note: null,
    permit: { permitNumber: 'WRN-PC-2026-0418', adoptedCode: 'ipc-2018', localAmendments: 'Town of Wrenmoor amendments (invented)', preparerLicence: 'PE 40417', licenceJurisdiction: 'Wrenmoor (invented)' } },
  document: doc, analysis: a,
  attestation: { name: 'Dana Whitlow', licenceNumber: 'PE 40417', statement: 'I prepared this calculation and checked its inputs, method and results.', at: '2026-12-01T12:00:00.000Z' },
});
console.log(name, r.pageCount, 'pages', Math.round(performance.now() - t), 'ms');
fs.writeFileSync(`/tmp/ppdf/${name}.pdf`, r.bytes);
