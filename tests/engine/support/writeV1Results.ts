/**
 * Writes tests/engine/model/fixtures/v1-example-results.json: the numbers the version 1 engine
 * gave for the version 1 example documents, so that the test of the upgrade can show the
 * version 2 examples analyse bit for bit the same.
 *
 * Run it with the engine and examples of a version 1 checkout (before document version 2), e.g.
 *   npx tsx tests/engine/support/writeV1Results.ts <path of that checkout> <output file>
 * The committed file was written from commit 424b158 (the verdict contract, last version 1 engine).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const [root, out] = process.argv.slice(2);
const engine = (await import(join(root, 'src/engine/index.ts'))) as {
  analyzeSystem: (d: unknown) => { si: Record<string, { [k: string]: unknown }[]> & { source: Record<string, number> } };
};
const results: Record<string, unknown> = {};
for (const name of ['alder-finch-cold', 'alder-finch-hot', 'small-house']) {
  const doc = JSON.parse(readFileSync(join(root, 'src/engine/examples', `${name}.json`), 'utf8'));
  const a = engine.analyzeSystem(doc);
  const si = a.si as unknown as {
    source: { pressureAtDesignFlow: number; designFlow: number };
    nodes: { id: string; elevation: number; pressure: number; staticPressureHigh: number; staticPressureLow: number }[];
    segments: { id: string; designFlow: number; rise: number; riseLoss: number; outletPressure: number }[];
    fixtures: { id: string; residual: number; margin: number }[];
  };
  results[name] = {
    source: [si.source.pressureAtDesignFlow, si.source.designFlow],
    nodes: si.nodes.map((n) => [n.id, n.elevation, n.pressure, n.staticPressureHigh, n.staticPressureLow]),
    segments: si.segments.map((s) => [s.id, s.designFlow, s.rise, s.riseLoss, s.outletPressure]),
    fixtures: si.fixtures.map((f) => [f.id, f.residual, f.margin]),
  };
}
writeFileSync(out, `${JSON.stringify(results)}\n`);
console.log(`wrote ${out}`);
