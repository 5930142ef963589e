// Demo scenario (invented): the "Alder & Finch" building at 410 Quarry Lane, Wrenmoor.
// No real people, firms or places. Password for every demo account: headroom-demo.
import type { Knex } from 'knex';
import { hashPassword } from '../server/auth/password';

export const DEMO_PASSWORD = 'headroom-demo';

export const DEMO_USERS = [
  { email: 'admin@alder-finch.example', name: 'Rowan Admin', is_admin: true, account_role: 'designer' as const, projectRole: null },
  { email: 'designer@alder-finch.example', name: 'Dana Whitlow', is_admin: false, account_role: 'designer' as const, projectRole: 'designer' as const },
  { email: 'contractor@alder-finch.example', name: 'Casey Brandt', is_admin: false, account_role: 'contractor' as const, projectRole: 'contractor' as const },
  { email: 'inspector@alder-finch.example', name: 'Imogen Hale', is_admin: false, account_role: 'inspector' as const, projectRole: 'inspector' as const },
  { email: 'outsider@alder-finch.example', name: 'Oscar Pell', is_admin: false, account_role: 'designer' as const, projectRole: null },
];

export async function seed(knex: Knex): Promise<void> {
  await knex.raw('TRUNCATE audit_log, project_members, projects, invitations, session, users RESTART IDENTITY CASCADE');
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const users = await knex('users')
    .insert(DEMO_USERS.map(({ projectRole: _r, ...u }) => ({ ...u, password_hash: passwordHash, status: 'active' })))
    .returning(['id', 'email']);
  const idOf = (email: string) => users.find((u: { email: string }) => u.email === email)!.id as string;

  const [project] = await knex('projects')
    .insert({
      name: 'Alder & Finch',
      address: '410 Quarry Lane, Wrenmoor',
      code_basis: 'Model plumbing code as adopted by the (invented) Town of Wrenmoor, with its local amendments; state the edition here.',
      unit_system: 'US',
      // an invented plan-check number and licence, in the invented town
      permit: JSON.stringify({
        permitNumber: 'WRN-PC-2026-0418',
        adoptedCode: 'ipc-2018',
        localAmendments: 'Town of Wrenmoor plumbing amendments (invented)',
        preparerLicence: 'PE 40417',
        licenceJurisdiction: 'Wrenmoor (invented)',
      }),
      notes:
        'Seven storeys: retail at grade, six floors of apartments, roof mechanical room. 2-inch meter, reduced-pressure backflow assembly, copper risers, PEX fixture branches.',
      created_by: idOf('designer@alder-finch.example'),
    })
    .returning('id');
  await knex('project_members').insert(
    DEMO_USERS.filter((u) => u.projectRole).map((u) => ({ project_id: project.id, user_id: idOf(u.email), role: u.projectRole })),
  );

  // A second invented project of the same team: a tall building study down the lane, in pressure zones.
  const [tower] = await knex('projects')
    .insert({
      name: TOWER_PROJECT,
      address: '414 Quarry Lane, Wrenmoor',
      code_basis: 'Model plumbing code as adopted by the (invented) Town of Wrenmoor, with its local amendments; state the edition here.',
      unit_system: 'US',
      notes: 'Sixteen storeys of apartments on the high-pressure main: a PRV zone, a zone from the supply and a booster zone (invented study).',
      created_by: idOf('designer@alder-finch.example'),
    })
    .returning('id');
  await knex('project_members').insert(
    DEMO_USERS.filter((u) => u.projectRole).map((u) => ({ project_id: tower.id, user_id: idOf(u.email), role: u.projectRole })),
  );
}

/** The demo's second project: the zoned tall building (invented). */
export const TOWER_PROJECT = 'Quarry Lane tower study';
