/**
 * The draft save's service part (engine, lock, write, audit, the answer's JSON) as it was before the
 * lean answer and the compact stored analysis, against the current `systemsService.saveDraft`, in
 * one process over one throw-away PostgreSQL cluster, runs alternating so the machine's load falls
 * on both. Prints the two medians. A diagnosis beside scripts/bench/save-split.ts, not a row of the
 * bench table (that measures the whole route through HTTP: scripts/bench/api.ts).
 *
 *   npx tsx scripts/bench/save-before-after.ts
 */
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { createDb, demoDocument, startCluster } from '../../tests/load/world';
import { analyse, systemsService } from '../../server/services/systems';
import { revisionsRepo, systemsRepo } from '../../server/repositories/systems';
import { auditRepo } from '../../server/repositories/audit';
import { ENGINE_VERSION, type SystemDocument } from '../../src/engine';
import { median } from './table';
const cluster = await startCluster('before_after');
const db = createDb(cluster.url);
try {
  const [user] = await db('users')
    .insert({ email: `u-${randomUUID()}@t.example`, name: 'U', account_role: 'designer', status: 'active', password_hash: 'x', is_admin: false })
    .returning('*');
  const [project] = await db('projects').insert({ name: 'S', unit_system: 'US', created_by: user.id }).returning('*');
  const system = await systemsRepo.insert(db, { project_id: project.id, name: 'Cold', service: 'cold', created_by: user.id });
  const document = demoDocument() as unknown as SystemDocument;
  const rev = await revisionsRepo.insert(db, {
    system_id: system.id,
    number: 1,
    document,
    analysis: analyse(document),
    engine_version: ENGINE_VERSION,
    created_by: user.id,
  });
  let version = rev.version;
  const ctx = { db, config: {} } as Parameters<typeof systemsService.saveDraft>[0];
  // the save as it was before this branch: whole rows read back, the whole analysis written, the whole revision answered
  const before = async () => {
    const analysis = analyse(document);
    const answer: { version: number } = await db.transaction(async (trx): Promise<{ version: number }> => {
      await trx('revisions').where({ id: rev.id, system_id: system.id }).forUpdate().first();
      const [saved] = await trx('revisions')
        .where({ id: rev.id, version, status: 'draft' })
        .update({
          document: JSON.stringify(document),
          analysis: JSON.stringify(analysis),
          engine_version: ENGINE_VERSION,
          version: trx.raw('version + 1'),
          updated_at: trx.fn.now(),
        })
        .returning('*');
      await auditRepo.record(trx, {
        actorId: user.id,
        projectId: project.id,
        action: 'revision.saved',
        subjectType: 'revision',
        subjectId: rev.id,
        details: { number: 1, version: saved.version },
      });
      return (await trx('revisions as r')
        .leftJoin('users as u', 'u.id', 'r.issued_by')
        .leftJoin('users as ua', 'ua.id', 'r.failure_ack_by')
        .leftJoin('field_changes as fc', 'fc.id', 'r.field_change_id')
        .where({ 'r.id': rev.id })
        .first(['r.*', 'u.name as issued_by_name', 'ua.name as failure_ack_by_name', 'fc.record as field_change_record'])) as { version: number };
    });
    version = answer.version;
    return JSON.stringify({ revision: answer }).length;
  };
  const after = async () => {
    const saved = await systemsService.saveDraft(ctx, { id: user.id } as never, project.id, system.id, rev.id, document, version);
    version = saved.version;
    return JSON.stringify({ revision: saved }).length;
  };
  const t = { before: [] as number[], after: [] as number[] };
  for (let i = 0; i < 60; i++) {
    for (const [name, f] of (i % 2
      ? [
          ['before', before],
          ['after', after],
        ]
      : [
          ['after', after],
          ['before', before],
        ]) as [keyof typeof t, () => Promise<number>][]) {
      const t0 = performance.now();
      await f();
      if (i >= 10) t[name].push(performance.now() - t0);
    }
  }
  console.log(
    `service part of the draft save, demo document, median of 50 alternating runs: before ${median(t.before).toFixed(1)} ms, after ${median(t.after).toFixed(1)} ms`,
  );
} finally {
  await db.destroy();
  cluster.destroy();
}
