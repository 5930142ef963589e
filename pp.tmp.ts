import fs from 'node:fs';
import { analyzeSystem, SystemDocumentSchema } from './src/engine';
import { apartmentBuildingDocument } from './src/engine/building/apartmentBuilding';
import { riserDiagram, fitRiserDiagram, riserElementsByFloor } from './src/shared/diagram/riserLayout';
const docs = ['alder-finch-cold','alder-finch-hot','small-house'].map(f=>SystemDocumentSchema.parse(JSON.parse(fs.readFileSync(`src/engine/examples/${f}.json`,'utf8'))));
docs.push(SystemDocumentSchema.parse(apartmentBuildingDocument(40, 8)));
for (const doc of docs) {
  const t=performance.now();
  const a = analyzeSystem(doc);
  const d = riserDiagram(doc, a);
  const sheets = fitRiserDiagram(d, { left: 40, bottom: 40, width: 712, height: 500 });
  console.log(doc.name, 'sheets', sheets.length, sheets.map(s=>s.items.length).join(','), Math.round(performance.now()-t),'ms');
  console.log(riserElementsByFloor(d).map(l=>l.slice(0,300)).join('\n'));
}
