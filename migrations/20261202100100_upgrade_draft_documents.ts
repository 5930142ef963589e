import type { Knex } from 'knex';
import { ENGINE_VERSION, readSystemDocument, safeAnalyzeSystem } from '../src/engine';

/**
 * Document version 2 (one truth for elevations) for every stored DRAFT: each version 1 draft is
 * upgraded with 'follow-rises' (the rise a designer typed was the intent; elevations left at the
 * source's were not) and analysed again; its version goes up, so an editor open on the old
 * document gets "changed by someone else" and reloads rather than writing version 1 back.
 * Issued and superseded revisions are never touched: their documents and analyses stay as issued
 * (the read path shows them upgraded with 'keep-elevations', which reproduces what was analysed).
 *
 * This migration runs the engine of its day; a draft the version 1 schema refuses is left as it
 * is and named in the log (it could not have been saved by the server).
 */
export async function up(knex: Knex): Promise<void> {
  const drafts = await knex('revisions as r')
    .join('systems as s', 's.id', 'r.system_id')
    .where('r.status', 'draft')
    .whereRaw(`coalesce((r.document->>'schemaVersion')::int, 1) < 2`)
    .select('r.id', 'r.number', 'r.document', 's.project_id');
  for (const d of drafts) {
    const read = readSystemDocument(d.document, { riseConflict: 'follow-rises' });
    if (!read.success) {
      console.warn(`[headroom] draft revision ${d.id} is not a valid version 1 document; left as it is`);
      continue;
    }
    const { data: document, conflicts } = read;
    const result = safeAnalyzeSystem(document);
    const analysis = result.ok ? { ok: true, analysis: result.analysis } : { ok: false, error: result.error.toJSON() };
    await knex('revisions')
      .where({ id: d.id, status: 'draft' })
      .update({
        document: JSON.stringify(document),
        analysis: JSON.stringify(analysis),
        engine_version: ENGINE_VERSION,
        version: knex.raw('version + 1'),
        updated_at: knex.fn.now(),
      });
    await knex('audit_log').insert({
      actor_id: null,
      project_id: d.project_id,
      action: 'revision.upgraded',
      subject_type: 'revision',
      subject_id: d.id,
      details: JSON.stringify({ number: d.number, from: 1, to: 2, riseConflict: 'follow-rises', risesFollowed: conflicts.map((c) => c.segmentId) }),
    });
  }
}

/** Version 2 drafts are not turned back into version 1: the old form allowed contradictions. */
export async function down(): Promise<void> {}
