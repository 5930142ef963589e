// Catalog rows from the engine's catalogs (runs after the demo seeds, whose TRUNCATE … CASCADE would empty it),
// which name the published source of every datum (src/engine/catalog, src/engine/fittings/types.ts). The engine and the database therefore hold
// the same numbers; tests/api/catalog.test.ts checks that they agree.
import type { Knex } from 'knex';
import { catalogRows } from '../server/services/catalogRows';

export async function seed(knex: Knex): Promise<void> {
  await knex('catalog_entries').whereNull('project_id').delete();
  await knex('catalog_entries').insert(catalogRows().map((r) => ({ ...r, data: JSON.stringify(r.data) })));
}
