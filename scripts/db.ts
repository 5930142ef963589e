// Database chores run with tsx: `migrate` (latest), `seed` (demo scenario), `setup` (migrate,
// then seed the demo when there are no users yet — what `npm start` does), `catalogs` (migrate and
// seed only the cited catalogs, for the API tests).
import { createDb } from '../server/db/knex';

const command = process.argv[2] ?? 'setup';
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set.');
  process.exit(1);
}
const db = createDb(url);
try {
  const [, applied] = await db.migrate.latest();
  if (applied.length) console.log(`[headroom] applied ${applied.length} migration(s)`);
  if (command === 'catalogs') {
    // the API tests' database: the schema and the cited catalogs, no demo scenario
    await db.seed.run({ specific: '03_catalogs.ts' });
  }
  if (command === 'seed' || command === 'setup') {
    const { count } = (await db('users').count({ count: '*' }).first()) as { count: string };
    if (command === 'seed' || Number(count) === 0) {
      await db.seed.run();
      console.log('[headroom] seeded the demo scenario (Alder & Finch, Wrenmoor)');
    }
  }
} catch (err) {
  console.error('[headroom] database setup failed:', err instanceof Error ? err.message : err);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
