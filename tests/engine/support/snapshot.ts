/**
 * Result snapshot of the engine, for performance work that must not change any result.
 *
 *   npx tsx tests/engine/support/snapshot.ts write     # save .tmp/perf-baseline/*.json
 *   npx tsx tests/engine/support/snapshot.ts compare   # compare the current engine with them
 *
 * Cases: the example documents, generated buildings and random trees under every friction,
 * fitting and demand method, both unit systems, low-Reynolds trees (laminar and transitional
 * warnings), and a set of broken documents (schema, catalog, reference and topology errors).
 * Compare: every number equal within a relative 1e-12 (bit-identical is reported separately),
 * every string, boolean, warning and error identical. The baseline directory is git-ignored.
 */
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { safeAnalyzeSystem, ledgerFor, type SystemDocumentInput } from '../../../src/engine';
import { generateBuilding, generateRandomTree, mulberry32 } from '../../../src/engine/testing/generateTree';
import { oneSegment, smallTree, clone } from './docs';

const ROOT = new URL('../../../', import.meta.url).pathname;
const OUT = join(ROOT, '.tmp/perf-baseline');
/** Round-off allowance for reordered floating-point arithmetic; the aim is bit-identical. */
const RTOL = 1e-12;

type Doc = Record<string, unknown> & SystemDocumentInput;

function examples(): [string, unknown][] {
  const dir = join(ROOT, 'src/engine/examples');
  return readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => [`example-${f.replace(/\.json$/, '')}`, JSON.parse(readFileSync(join(dir, f), 'utf8'))]);
}

function withCriteria(d: SystemDocumentInput, criteria: NonNullable<SystemDocumentInput['criteria']>): Doc {
  const c = clone(d) as Doc;
  c.criteria = { ...(c.criteria ?? {}), ...criteria };
  return c;
}

function validCases(): [string, unknown][] {
  const cases: [string, unknown][] = [...examples()];
  const b10 = generateBuilding({ storeys: 10 });
  const b40 = generateBuilding({ storeys: 40 });
  cases.push(['building-40', b40]);
  cases.push(['building-10', b10]);
  cases.push(['building-3-2apt', generateBuilding({ storeys: 3, apartmentsPerStorey: 2, storeyHeightFt: 12 })]);
  for (const fm of ['hooper-2k', 'darby-3k', 'equivalent-length'] as const) cases.push([`building-10-${fm}`, withCriteria(b10, { fittingMethod: fm })]);
  for (const m of ['colebrook', 'churchill-1977', 'hazen-williams'] as const) cases.push([`building-10-${m}`, withCriteria(b10, { frictionMethod: m })]);
  cases.push(['building-10-flush-valve', withCriteria(b10, { demandCurve: 'flush-valve', maxStaticPressure: 60, minStaticPressure: 500 })]);
  const hot = clone(b10) as Doc;
  hot.service = 'hot';
  hot.waterTemperature = 140;
  cases.push(['building-10-hot', hot]);
  const binomial = clone(b10) as Doc;
  for (const n of binomial.nodes) {
    for (const g of n.fixtureGroups ?? []) (g as Record<string, unknown>).usage = { durationSeconds: 30, recurrenceSeconds: 600 };
  }
  binomial.criteria = { demandMethod: 'hunter-binomial' };
  cases.push(['building-10-binomial', binomial]);
  const FITTINGS = ['elbow-90-standard', 'tee-run', 'tee-branch', 'valve-globe'];
  for (const [seed, method] of [
    [2024, 'swamee-jain'],
    [7, 'colebrook'],
    [99, 'churchill-1977'],
    [123, 'hazen-williams'],
  ] as const) {
    cases.push([`random-${seed}-${method}`, generateRandomTree(mulberry32(seed), { segments: 2000, fittingTypes: FITTINGS, frictionMethod: method })]);
  }
  cases.push([
    'random-bench',
    generateRandomTree(mulberry32(2024), { segments: 5000, fittingTypes: ['elbow-90-standard', 'tee-run'], frictionMethod: 'swamee-jain' }),
  ]);
  const lowRe = generateRandomTree(mulberry32(5), { segments: 300, fittingTypes: FITTINGS, frictionMethod: 'colebrook', minReynolds: 200 });
  // Tiny demands: laminar and transitional segments (and their warnings).
  lowRe.nodes.forEach((n, i) => {
    if (n.continuousDemand !== undefined) n.continuousDemand *= [0.002, 0.02, 0.2][i % 3];
  });
  cases.push(['random-lowRe-colebrook', lowRe]);
  for (const fm of ['hooper-2k', 'darby-3k', 'equivalent-length'] as const) cases.push([`random-lowRe-${fm}`, withCriteria(lowRe, { fittingMethod: fm })]);
  const reducers = generateRandomTree(mulberry32(11), { segments: 400, fittingTypes: FITTINGS });
  for (const s of reducers.segments) delete (s as Record<string, unknown>).reducerAuto;
  cases.push(['random-reducers', reducers]);
  cases.push(['one-segment', oneSegment()]);
  const valves = clone(b10) as Doc;
  valves.nodes.forEach((n, i) => {
    if (i % 7 === 0 && n.fixtureGroups?.length) n.fixtureGroups = [{ fixtureTypeId: 'water-closet-flush-valve-private', count: 2, wsfuBasis: 'total' }];
    if (i % 11 === 0 && n.id !== 'main') n.continuousDemand = 0.5;
  });
  valves.segments.forEach((s, i) => {
    if (i % 19 === 0) s.flowOverride = 4;
    if (i % 23 === 0) s.reducerAuto = false;
  });
  valves.criteria = {
    velocityLimits: [
      { material: 'copper', service: 'cold', maxVelocity: 4 },
      { material: 'steel', service: 'hot', maxVelocity: 9 },
    ],
    minFlowPressures: { 'lavatory-private': 12 },
  };
  cases.push(['building-10-valves-overrides', valves]);
  cases.push([
    'one-segment-flow-test',
    oneSegment({
      source: {
        kind: 'utility-main',
        nodeId: 'src',
        staticPressureLow: 450,
        staticPressureHigh: 500,
        pressureBasis: 'test',
        flowTest: { staticPressure: 480, residualPressure: 300, flow: 0.3 },
      },
    }),
  ]);
  cases.push([
    'one-segment-devices',
    oneSegment({
      devices: [
        {
          id: 'm',
          kind: 'meter',
          label: 'Meter',
          segmentId: 's1',
          loss: {
            kind: 'curve',
            points: [
              { flow: 0.2, loss: 10 },
              { flow: 0.4, loss: 30 },
              { flow: 1, loss: 100 },
            ],
          },
        },
        { id: 'b', kind: 'booster-pump', label: 'Booster', segmentId: 's1', loss: { kind: 'fixed', loss: 5 }, boost: { gain: 200 } },
        { id: 'p', kind: 'prv', label: 'PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 3 }, prv: { setPressure: 350 } },
      ],
    }),
  ]);
  cases.push(['one-segment-US', oneSegment({ unitSystem: 'US', waterTemperature: 60 })]);
  cases.push(['small-tree', smallTree()]);
  return cases;
}

/** Broken documents: each mutation applied to a small valid document. */
function invalidCases(): [string, unknown][] {
  const base = () => clone(oneSegment()) as Doc;
  const mutations: [string, (d: Doc) => unknown][] = [
    ['not-an-object', () => 42],
    ['null', () => null],
    [
      'missing-id',
      (d) => {
        delete (d as Record<string, unknown>).id;
        return d;
      },
    ],
    ['wrong-schema-version', (d) => ({ ...d, schemaVersion: 3 })],
    ['unknown-key', (d) => ({ ...d, colour: 'red' })],
    [
      'nan-elevation',
      (d) => {
        d.nodes[0].elevation = NaN;
        return d;
      },
    ],
    [
      'infinite-length',
      (d) => {
        d.segments[0].length = Infinity;
        return d;
      },
    ],
    [
      'negative-length',
      (d) => {
        d.segments[0].length = -1;
        return d;
      },
    ],
    [
      'zero-diameter',
      (d) => {
        d.segments[0] = {
          ...d.segments[0],
          material: undefined,
          size: undefined,
          custom: { innerDiameter: 0, roughness: 0, hazenWilliamsC: 130, velocityClass: 'copper' },
        };
        delete d.segments[0].material;
        delete d.segments[0].size;
        return d;
      },
    ],
    [
      'string-count',
      (d) => {
        d.segments[0].fittings = [{ typeId: 'tee-run', count: '2' as unknown as number }];
        return d;
      },
    ],
    [
      'fractional-count',
      (d) => {
        d.segments[0].fittings = [{ typeId: 'tee-run', count: 1.5 }];
        return d;
      },
    ],
    ['bad-enum', (d) => ({ ...d, service: 'warm' })],
    ['empty-nodes', (d) => ({ ...d, nodes: [] })],
    [
      'unknown-material',
      (d) => {
        d.segments[0].material = 'gold';
        return d;
      },
    ],
    [
      'unknown-size',
      (d) => {
        d.segments[0].size = '9';
        return d;
      },
    ],
    [
      'unknown-fitting',
      (d) => {
        d.segments[0].fittings = [{ typeId: 'teapot', count: 1 }];
        return d;
      },
    ],
    [
      'unknown-fixture',
      (d) => {
        d.nodes[1].checkedFixtures = [{ id: 'x', fixtureTypeId: 'bathtub-of-gold' }];
        return d;
      },
    ],
    [
      'duplicate-node',
      (d) => {
        d.nodes.push({ ...d.nodes[1] });
        return d;
      },
    ],
    [
      'unknown-node',
      (d) => {
        d.segments[0].to = 'nowhere';
        return d;
      },
    ],
    [
      'no-source',
      (d) => {
        d.source.nodeId = 'nowhere';
        return d;
      },
    ],
    [
      'static-high-below-low',
      (d) => {
        d.source.staticPressureHigh = 100;
        return d;
      },
    ],
    [
      'self-loop',
      (d) => {
        d.segments[0].to = 'src';
        d.segments[0].from = 'src';
        return d;
      },
    ],
    [
      'disconnected',
      (d) => {
        d.nodes.push({ id: 'island', elevation: 0 });
        return d;
      },
    ],
    [
      'cycle',
      (d) => {
        d.nodes.push({ id: 'a', elevation: 0 }, { id: 'b', elevation: 0 });
        d.segments.push(
          { id: 'ab', from: 'a', to: 'b', material: 'copper-l', size: '1', length: 1 },
          { id: 'ba', from: 'b', to: 'a', material: 'copper-l', size: '1', length: 1 },
        );
        return d;
      },
    ],
    [
      'prv-without-set',
      (d) => {
        d.devices = [{ id: 'p', kind: 'prv', label: 'PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 0 } }];
        return d;
      },
    ],
    [
      'device-bad-loss-kind',
      (d) => {
        d.devices = [{ id: 'p', kind: 'meter', label: 'M', segmentId: 's1', loss: { kind: 'table' } as never }];
        return d;
      },
    ],
    ['temperature-out-of-range', (d) => ({ ...d, waterTemperature: 150 })],
    [
      'binomial-without-usage',
      (d) => {
        d.nodes[1].fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 2 }];
        d.criteria = { demandMethod: 'hunter-binomial' };
        return d;
      },
    ],
    [
      'many-issues',
      (d) => {
        d.segments[0].length = -1;
        d.nodes[0].elevation = 'x' as unknown as number;
        (d as Record<string, unknown>).extra = 1;
        delete (d.source as Record<string, unknown>).pressureBasis;
        return d;
      },
    ],
  ];
  return mutations.map(([name, m]) => [`invalid-${name}`, m(base())]);
}

function run(doc: unknown): unknown {
  const r = safeAnalyzeSystem(doc);
  if (!r.ok) return { error: r.error.toJSON() };
  const a = r.analysis;
  const critical = a.criticalFixtureId;
  return { analysis: a, criticalLedger: critical === null ? null : ledgerFor(a, critical) };
}

export function allCases(): [string, unknown][] {
  return [...validCases(), ...invalidCases()];
}

interface Diff {
  path: string;
  detail: string;
}

function compare(a: unknown, b: unknown, path: string, diffs: Diff[], stats: { numbers: number; bitDiffer: number; maxRel: number }): void {
  if (diffs.length > 20) return;
  if (typeof a === 'number' && typeof b === 'number') {
    stats.numbers++;
    if (Object.is(a, b)) return;
    stats.bitDiffer++;
    const rel = Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
    stats.maxRel = Math.max(stats.maxRel, rel);
    if (!(rel <= RTOL)) diffs.push({ path, detail: `${a} vs ${b} (rel ${rel})` });
    return;
  }
  if (typeof a !== typeof b || (a === null) !== (b === null) || Array.isArray(a) !== Array.isArray(b)) {
    diffs.push({ path, detail: `type ${JSON.stringify(a)?.slice(0, 80)} vs ${JSON.stringify(b)?.slice(0, 80)}` });
    return;
  }
  if (a === null || typeof a !== 'object') {
    if (a !== b) diffs.push({ path, detail: `${JSON.stringify(a)} vs ${JSON.stringify(b)}` });
    return;
  }
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    if (a.length !== bb.length) diffs.push({ path, detail: `length ${a.length} vs ${bb.length}` });
    for (let i = 0; i < Math.min(a.length, bb.length); i++) compare(a[i], bb[i], `${path}[${i}]`, diffs, stats);
    return;
  }
  const ao = a as Record<string, unknown>;
  const bo = b as Record<string, unknown>;
  const ka = Object.keys(ao);
  const kb = Object.keys(bo);
  if (ka.join() !== kb.join()) diffs.push({ path, detail: `keys [${ka.join()}] vs [${kb.join()}]` });
  for (const k of ka) if (k in bo) compare(ao[k], bo[k], `${path}.${k}`, diffs, stats);
}

function main() {
  const mode = process.argv[2];
  if (mode !== 'write' && mode !== 'compare') throw new Error('usage: snapshot.ts write|compare');
  mkdirSync(OUT, { recursive: true });
  let failed = 0;
  let total = { numbers: 0, bitDiffer: 0, maxRel: 0 };
  for (const [name, doc] of allCases()) {
    // Through JSON, as the results leave the engine (−0 becomes 0; the engine emits no −0 by contract).
    const result = JSON.parse(JSON.stringify(run(doc)));
    const file = join(OUT, `${name}.json`);
    if (mode === 'write') {
      writeFileSync(file, JSON.stringify(result));
      continue;
    }
    const base = JSON.parse(readFileSync(file, 'utf8'));
    const diffs: Diff[] = [];
    const stats = { numbers: 0, bitDiffer: 0, maxRel: 0 };
    compare(base, result, name, diffs, stats);
    total = { numbers: total.numbers + stats.numbers, bitDiffer: total.bitDiffer + stats.bitDiffer, maxRel: Math.max(total.maxRel, stats.maxRel) };
    if (diffs.length > 0) {
      failed++;
      console.log(`DIFFERS ${name}`);
      for (const d of diffs.slice(0, 10)) console.log(`  ${d.path}: ${d.detail}`);
    }
  }
  if (mode === 'write') {
    console.log(`wrote ${allCases().length} snapshots to ${OUT}`);
    return;
  }
  console.log(
    `${allCases().length} cases, ${failed} differ; ${total.numbers} numbers compared, ${total.bitDiffer} not bit-identical, largest relative difference ${total.maxRel}`,
  );
  if (failed > 0) process.exitCode = 1;
}

main();
