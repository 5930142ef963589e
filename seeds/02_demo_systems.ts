// Demo scenario (invented): the Alder & Finch cold- and hot-water systems, made through the same
// services a designer uses, so a new user sees issued revisions with real results at first sign-in.
import fs from 'node:fs';
import type { Knex } from 'knex';
import { loadConfig } from '../server/config';
import { systemsService } from '../server/services/systems';
import type { ServiceContext } from '../server/services/context';

const example = (name: string) => JSON.parse(fs.readFileSync(new URL(`../src/engine/examples/${name}`, import.meta.url), 'utf8'));

export async function seed(knex: Knex): Promise<void> {
  const project = await knex('projects').where({ name: 'Alder & Finch' }).first('id');
  const designer = await knex('users').where({ email: 'designer@alder-finch.example' }).first('id', 'is_admin', 'account_role');
  if (!project || !designer) throw new Error('the demo accounts seed must run first');
  const ctx: ServiceContext = {
    db: knex,
    config: loadConfig({ NODE_ENV: 'test', DATABASE_URL: 'postgres://seed.invalid/seed', SESSION_SECRET: 'seed-only-secret-seed-only-secret-0000' }),
  };
  const actor = { id: designer.id, isAdmin: designer.is_admin, accountRole: designer.account_role };
  // the demo designer's attestation (an invented licence number, the one the project states)
  const attestation = { name: 'Dana Whitlow', licenceNumber: 'PE 40417', basis: 'prepared' as const, confirmed: true as const };

  // Cold water: revision 1 issued, revision 2 a draft started from it.
  const cold = await systemsService.create(ctx, actor, project.id, { name: 'Domestic cold water', service: 'cold', document: example('alder-finch-cold.json') });
  const issued = await systemsService.issue(ctx, actor, project.id, cold.system.id, cold.revision.id, cold.revision.version, 'Permit set', null, attestation);
  await systemsService.newDraft(ctx, actor, project.id, cold.system.id, issued.id);

  // Hot water: revision 1 issued.
  const hot = await systemsService.create(ctx, actor, project.id, { name: 'Domestic hot water', service: 'hot', document: example('alder-finch-hot.json') });
  await systemsService.issue(ctx, actor, project.id, hot.system.id, hot.revision.id, hot.revision.version, 'Permit set', null, attestation);
}
