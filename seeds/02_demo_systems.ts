// Demo scenario (invented): the Alder & Finch cold- and hot-water systems, made through the same
// services a designer uses, so a new user sees issued revisions with real results at first sign-in;
// and the design variants (seeds/variants/demoVariants.ts): the cold system sized by Headroom, the
// hot system fed from the cold one, and the zoned tower study in its own project.
import type { Knex } from 'knex';
import { loadConfig } from '../server/config';
import { systemsService } from '../server/services/systems';
import type { ServiceContext } from '../server/services/context';

import { TOWER_PROJECT } from './01_demo_accounts_and_project';
import { example, hotFedFromColdDocument, sizedColdDocument, zonedTowerDocument } from './variants/demoVariants';

/** The variants' system names (tests find them by these). */
export const DEMO_VARIANTS = {
  sizedCold: 'Domestic cold water, sized by Headroom',
  hotFedFromCold: 'Domestic hot water, fed from the cold system',
  tower: 'Domestic cold water, three pressure zones',
} as const;

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
  const cold = await systemsService.create(ctx, actor, project.id, {
    name: 'Domestic cold water',
    service: 'cold',
    document: example('alder-finch-cold.json'),
  });
  const issued = await systemsService.issue(ctx, actor, project.id, cold.system.id, cold.revision.id, cold.revision.version, 'Permit set', null, attestation);
  await systemsService.newDraft(ctx, actor, project.id, cold.system.id, issued.id);

  // Hot water: revision 1 issued.
  const hot = await systemsService.create(ctx, actor, project.id, { name: 'Domestic hot water', service: 'hot', document: example('alder-finch-hot.json') });
  await systemsService.issue(ctx, actor, project.id, hot.system.id, hot.revision.id, hot.revision.version, 'Permit set', null, attestation);

  // The cold system as Headroom's sizing leaves it (basis recorded), issued so its summary states the basis.
  const sized = await systemsService.create(ctx, actor, project.id, { name: DEMO_VARIANTS.sizedCold, service: 'cold', document: sizedColdDocument() });
  await systemsService.issue(
    ctx,
    actor,
    project.id,
    sized.system.id,
    sized.revision.id,
    sized.revision.version,
    'Sized variant for comparison',
    null,
    attestation,
  );

  // The hot system fed from the cold one: its supply is read from the cold system's draft at the heater feed.
  const fed = await systemsService.create(ctx, actor, project.id, {
    name: DEMO_VARIANTS.hotFedFromCold,
    service: 'hot',
    document: hotFedFromColdDocument(cold.system.id),
  });
  await systemsService.issue(ctx, actor, project.id, fed.system.id, fed.revision.id, fed.revision.version, 'Fed from the cold system', null, attestation);

  // The zoned tall building, in its own project.
  const towerProject = await knex('projects').where({ name: TOWER_PROJECT }).first('id');
  if (!towerProject) throw new Error('the demo accounts seed must make the tower project');
  const tower = await systemsService.create(ctx, actor, towerProject.id, { name: DEMO_VARIANTS.tower, service: 'cold', document: zonedTowerDocument() });
  await systemsService.issue(ctx, actor, towerProject.id, tower.system.id, tower.revision.id, tower.revision.version, 'Zoning study', null, attestation);
}
