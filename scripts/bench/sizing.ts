/**
 * Sizing rows: sizeSystem on generated buildings against one analysis of the same document, timed
 * in the same run (interleaved), with their ratio (issue #15 aims at ≤ 10 analyses' time). Three
 * buildings:
 *
 *   - the 40-storey apartment building of src/engine/building/apartmentBuilding.ts (floors, a
 *     typical apartment placed 160 times) on its 60 psi main: no choice of sizes passes (its top
 *     floors need a booster), so this row times the answer "short by …";
 *   - the demo's zoned tower study (seeds/variants: 16 storeys of typical apartments in three
 *     pressure zones, a PRV and a booster), where a choice exists: the main tree and the unit type's
 *     own piping (one size per unit type segment for its 64 placements) are sized;
 *   - the 5,000-segment building of src/engine/testing/generateTree.ts (every segment an ordinary
 *     catalog pipe): every segment is sized.
 *
 * Each row's note says where the sizing's time went (the analyses it runs — base, probes,
 * verifications —, the search, the rest) from the timings sizeSystem reports.
 *
 * Alone: `npx tsx scripts/bench/sizing.ts [runs]` prints the rows and the ratios.
 */
import { analyzeSystem, sizeSystem, type SizingResult } from '../../src/engine';
import { apartmentBuildingDocument } from '../../src/engine/building/apartmentBuilding';
import { generateBuilding } from '../../src/engine/testing/generateTree';
import { zonedTowerDocument } from '../../seeds/variants/demoVariants';
import { median, type BenchRow } from './table';

/** The aim of issue #15: sizing within 10 analyses' time. */
export const SIZING_AIM_RATIO = 10;

export async function sizingRows(runs: number, log: (m: string) => void = () => {}): Promise<BenchRow[]> {
  const cases = [
    { figure: 'engine: sizing, 40-storey apartment building (apartmentBuilding.ts), sizeSystem', doc: apartmentBuildingDocument(40) },
    { figure: 'engine: sizing, zoned 16-storey tower of typical apartments (unit types sized), sizeSystem', doc: zonedTowerDocument() },
    { figure: 'engine: sizing, generated 40-storey building, 5,000 segments, sizeSystem', doc: generateBuilding({ storeys: 40 }) },
  ];
  const rows: BenchRow[] = [];
  for (const c of cases) {
    // warm-up (JIT) of both
    analyzeSystem(c.doc);
    let last: SizingResult = sizeSystem(c.doc);
    const ours: number[] = [];
    const peer: number[] = [];
    for (let i = 0; i < runs; i++) {
      let t = performance.now();
      analyzeSystem(c.doc);
      peer.push(performance.now() - t);
      t = performance.now();
      last = sizeSystem(c.doc);
      ours.push(performance.now() - t);
    }
    const m = median(ours);
    const p = median(peer);
    const { analysesMs, searchMs, totalMs } = last.timings;
    const share = (x: number) => `${Math.round((100 * x) / totalMs)} %`;
    const note =
      `${last.analyses} analyses inside (${share(analysesMs)} of the time), search ${share(searchMs)}, the rest ${share(totalMs - analysesMs - searchMs)}; ` +
      `${last.feasible ? `${last.changedSegments} segments resized` : `no sizes pass: short ${(last.shortfallPa / 6894.757).toFixed(1)} psi`}`;
    log(`${c.figure}: ${m.toFixed(0)} ms vs one analysis ${p.toFixed(0)} ms → ratio ${(m / p).toFixed(2)} (${note})`);
    rows.push({
      figure: c.figure,
      unit: 'ms',
      median: m,
      runs,
      peer: { name: 'one analyzeSystem of the same document', median: p },
      aim: `≤ ${SIZING_AIM_RATIO} × one analysis`,
      note,
    });
  }
  return rows;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const runs = Number(process.argv[2] ?? 3);
  const rows = await sizingRows(runs, (m) => console.log(m));
  for (const r of rows) console.log(`${r.figure}: ratio ${(r.median / r.peer!.median).toFixed(2)} (aim ≤ ${SIZING_AIM_RATIO})`);
}
