/**
 * Writes tests/unit/fixtures/stored-analysis-format0.json: stored analyses in the form revisions kept
 * before the stored analysis had a format number (format 0: the engine's answer as it was,
 * `{ ok: true, analysis }` or `{ ok: false, error }`, every display copy included), made by this
 * engine from the small example system (SI) and from a copy of it the engine cannot compute.
 * tests/unit/storedAnalysis.test.ts reads them with today's reader: such rows stay in the database
 * (an issued revision's analysis is never rewritten), so the reader must keep reading them as they are.
 *
 *   npx tsx scripts/stored-analysis-fixture.ts
 *
 * Run it again only if the fixture is lost: it pins what was stored, not what the engine says now.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ENGINE_VERSION, safeAnalyzeSystem } from '../src/engine';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const example = JSON.parse(fs.readFileSync(path.join(root, 'src/engine/examples/small-house.json'), 'utf8'));
// the form server/services/systems.ts `analyse` wrote into revisions.analysis before formats existed
const format0 = (document: unknown) => {
  const r = safeAnalyzeSystem(document);
  return r.ok ? { ok: true, analysis: r.analysis } : { ok: false, error: r.error.toJSON() };
};
// a segment running from a node that is not in the system: an input error, stored as such
const broken = { ...example, segments: example.segments.map((s: { from: string }, i: number) => (i === 0 ? { ...s, from: 'no-such-node' } : s)) };

const fixture = {
  note: 'Stored analyses as revisions.analysis held them before the format number (format 0). Written by scripts/stored-analysis-fixture.ts; never edit by hand.',
  engineVersion: ENGINE_VERSION,
  computed: { document: 'src/engine/examples/small-house.json', stored: format0(example) },
  failed: { document: 'small-house.json with its first segment starting at a node that does not exist', stored: format0(broken) },
};
const out = path.join(root, 'tests/unit/fixtures/stored-analysis-format0.json');
fs.writeFileSync(out, JSON.stringify(fixture, null, 1) + '\n');
console.log(`wrote ${path.relative(root, out)} (${(fs.statSync(out).size / 1000).toFixed(1)} kB)`);
