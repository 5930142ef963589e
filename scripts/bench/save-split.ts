/**
 * Where a draft save's time goes: each stage of `PUT …/revisions/:id/document` run on its own, in
 * this process, on the demo's cold-water document, over a throw-away PostgreSQL cluster. Prints the
 * median milliseconds of each stage (and the bytes it moves), so the largest cost is the one fixed.
 *
 *   npx tsx scripts/bench/save-split.ts [runs]
 *
 * A diagnosis, not a figure of the bench table: stages run one after another without the HTTP
 * server, so their sum is the save's CPU and database time without Express and the session.
 * Stages in parentheses are what the save no longer does on its usual path, timed for comparison.
 */
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { createDb, demoDocument, startCluster } from '../../tests/load/world';
import { checkValue } from '../../server/http/validate';
import { assertStorable } from '../../server/services/storable';
import { SaveDocumentBody } from '../../src/shared/api/systems';
import { analyse, systemsService } from '../../server/services/systems';
import { revisionsRepo, systemsRepo } from '../../server/repositories/systems';
import { ENGINE_VERSION, type SystemDocument } from '../../src/engine';
import { fastParseSystemDocument } from '../../src/engine/model/fastParse';
import { storableText } from '../../server/http/documentGate';
import { median } from './table';
import { analyseParsed, toStoredAnalysis, toStoredDraftAnalysis } from '../../server/services/storedAnalysis';

const runs = Number(process.argv[2] ?? 40);
const cluster = await startCluster('split');
const db = createDb(cluster.url);
const times = new Map<string, number[]>();
const bytes = new Map<string, number>();
const time = async <T>(stage: string, f: () => T | Promise<T>): Promise<T> => {
  const t0 = performance.now();
  const out = await f();
  const list = times.get(stage) ?? [];
  list.push(performance.now() - t0);
  times.set(stage, list);
  return out;
};

try {
  const [user] = await db('users')
    .insert({ email: `split-${randomUUID()}@test.example`, name: 'Split', account_role: 'designer', status: 'active', password_hash: 'x', is_admin: false })
    .returning('*');
  const [project] = await db('projects').insert({ name: 'Split', unit_system: 'US', created_by: user.id }).returning('*');
  const system = await systemsRepo.insert(db, { project_id: project.id, name: 'Cold', service: 'cold', created_by: user.id });
  const document = demoDocument() as unknown as SystemDocument;
  const revision = await revisionsRepo.insert(db, {
    system_id: system.id,
    number: 1,
    document,
    analysis: analyse(document),
    engine_version: ENGINE_VERSION,
    created_by: user.id,
  });
  let version = revision.version;
  const ctx = { db, config: {} } as Parameters<typeof systemsService.saveDraft>[0];
  const actor = { id: user.id } as Parameters<typeof systemsService.saveDraft>[1];

  for (let i = 0; i < runs + 5; i++) {
    if (i === 5) times.clear(); // the first five warm the JIT and the pool
    (document as { segments: { length: number }[] }).segments[0].length = 10 + (i % 50);
    const text = JSON.stringify({ document, version });
    bytes.set('request', Buffer.byteLength(text));
    const parsed = await time('1 JSON.parse of the body (express.json)', () => JSON.parse(text));
    const read = await time('2 the generated reader (fastParse) of the document, on the request thread', () => fastParseSystemDocument(parsed.document));
    if (!read) throw new Error('the generated reader declines the demo document');
    await time('2b (zod check in the worker thread, now only for a body the reader declines)', () => checkValue(SaveDocumentBody, parsed));
    await time('3 storability on the JSON text', () => storableText(text));
    await time('3b (storability walk of the parsed body, now only after a \\u escape)', () => assertStorable(parsed));
    const analysis = await time('4 engine: analyseParsed(document) (no second read)', () => analyseParsed(read));
    await time('4b (engine: analyse(document), with its own read)', () => analyse(read));
    const stored = await time('5 stored form of a draft: its verdict', () => JSON.stringify(toStoredDraftAnalysis(analysis, ENGINE_VERSION)));
    await time('6 JSON.stringify(document)', () => JSON.stringify(read));
    bytes.set('document JSON', Buffer.byteLength(JSON.stringify(read)));
    bytes.set('stored analysis of a draft JSON', Buffer.byteLength(stored));
    bytes.set('issued form (format 1) JSON', Buffer.byteLength(JSON.stringify(toStoredAnalysis(analysis, ENGINE_VERSION))));
    await time('7 database: the service call (one statement: write + audit; verdict answer)', async () => {
      const saved = await systemsService.saveDraft(ctx, actor, project.id, system.id, revision.id, read, version);
      version = saved.version;
      const answer = await time('8 JSON.stringify of the answer', () => JSON.stringify({ revision: saved }));
      bytes.set('answer', Buffer.byteLength(answer));
    });
    await time('9 reading the draft back whole (analysis from the cache by content)', () => systemsService.revision(ctx, project.id, system.id, revision.id));
  }
  console.log(`save split, demo document, median of ${runs} runs (ms):`);
  for (const [stage, list] of [...times].sort(([a], [b]) => parseFloat(a) - parseFloat(b)))
    console.log(`  ${stage.padEnd(88)} ${median(list).toFixed(2).padStart(8)}`);
  console.log('bytes:');
  for (const [what, n] of bytes) console.log(`  ${what.padEnd(30)} ${(n / 1000).toFixed(1).padStart(8)} kB`);
} finally {
  await db.destroy();
  cluster.destroy();
}
