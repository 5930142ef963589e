/**
 * Where a draft save's time goes: each stage of `PUT …/revisions/:id/document` run on its own, in
 * this process, on the demo's cold-water document, over a throw-away PostgreSQL cluster. Prints the
 * median milliseconds of each stage (and the bytes it moves), so the largest cost is the one fixed.
 *
 *   npx tsx scripts/bench/save-split.ts [runs]
 *
 * A diagnosis, not a figure of the bench table: stages run one after another without the HTTP
 * server, so their sum is the save's CPU and database time without Express, the session and the
 * worker-thread hand-over.
 */
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { createDb, demoDocument, startCluster } from '../../tests/load/world';
import { checkValue } from '../../server/http/validate';
import { assertStorable } from '../../server/services/storable';
import { SaveDocumentBody } from '../../src/shared/api/systems';
import { analyse, systemsService } from '../../server/services/systems';
import { revisionsRepo, systemsRepo } from '../../server/repositories/systems';
import { auditRepo } from '../../server/repositories/audit';
import { ENGINE_VERSION, type SystemDocument } from '../../src/engine';
import { median } from './table';
import { toStoredAnalysis } from '../../server/services/storedAnalysis';

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
    const checked = await time('2 zod validation, early-stopping walk + full parse (worker thread)', () => checkValue(SaveDocumentBody, parsed));
    if (!checked.success) throw new Error('the demo document does not validate');
    await time('3 worker hand-over: JSON.parse in the worker, result stringified and parsed back', () => JSON.parse(JSON.stringify(JSON.parse(text))));
    await time('4 assertStorable walk', () => assertStorable(checked.data));
    const analysis = await time('5 engine: analyse(document)', () => analyse(checked.data.document));
    const stored = await time('6 stored form of the analysis (compact)', () => toStoredAnalysis(analysis, ENGINE_VERSION));
    const docJson = await time('7 JSON.stringify(document)', () => JSON.stringify(checked.data.document));
    const analysisJson = await time('8 JSON.stringify(stored analysis)', () => JSON.stringify(stored));
    bytes.set('document JSON', Buffer.byteLength(docJson));
    bytes.set('stored analysis JSON', Buffer.byteLength(analysisJson));
    bytes.set('full analysis JSON (before)', Buffer.byteLength(JSON.stringify(analysis)));
    await time('9 database: the whole service call (lock, write, audit, answer)', async () => {
      const saved = await systemsService.saveDraft(ctx, actor, project.id, system.id, revision.id, checked.data.document, version);
      version = saved.version;
      const answer = await time('10 JSON.stringify of the answer', () => JSON.stringify({ revision: saved }));
      bytes.set('answer', Buffer.byteLength(answer));
    });
    // the database parts on their own, inside one transaction like the service's
    await db.transaction(async (trx) => {
      await time('11 db: SELECT … FOR UPDATE (columns the save needs)', () => revisionsRepo.lockForSave(trx, system.id, revision.id));
      const saved = await time('12 db: UPDATE document + analysis', () =>
        revisionsRepo.saveDraft(trx, revision.id, version, document, analysis, ENGINE_VERSION),
      );
      version = saved!.version;
      await time('13 db: audit row', () =>
        auditRepo.record(trx, {
          actorId: user.id,
          projectId: project.id,
          action: 'revision.saved',
          subjectType: 'revision',
          subjectId: revision.id,
          details: { number: 1, version },
        }),
      );
    });
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
