import { EMPTY_PERMIT, PermitFields, type Member, type Project, type ProjectRole } from '../../src/shared/api/projects';
import { iso, type Tx } from '../db/rows';

export interface ProjectRow {
  id: string;
  name: string;
  address: string;
  code_basis: string;
  unit_system: 'US' | 'SI';
  notes: string;
  /** the permit fields (src/shared/api/projects.ts PermitFields); {} until the designer states them */
  permit: unknown;
  archived: boolean;
  version: number;
  created_at: Date;
  updated_at: Date;
}

/** The stored permit fields, with each missing one empty (rows from before they existed hold {}). */
export function permitOf(stored: unknown): PermitFields {
  const parsed = PermitFields.safeParse(typeof stored === 'string' ? JSON.parse(stored) : (stored ?? {}));
  return parsed.success ? parsed.data : { ...EMPTY_PERMIT };
}

export const toProject = (row: ProjectRow, myRole: ProjectRole | null): Project => ({
  id: row.id,
  name: row.name,
  address: row.address,
  codeBasis: row.code_basis,
  unitSystem: row.unit_system,
  notes: row.notes,
  permit: permitOf(row.permit),
  archived: row.archived,
  version: row.version,
  createdAt: iso(row.created_at),
  updatedAt: iso(row.updated_at),
  myRole,
});

interface MemberRow {
  user_id: string;
  email: string;
  name: string;
  role: ProjectRole;
  added_at: Date;
}
const toMember = (row: MemberRow): Member => ({ userId: row.user_id, email: row.email, name: row.name, role: row.role, addedAt: iso(row.added_at) });

export const projectsRepo = {
  listForUser: (db: Tx, userId: string) =>
    db<ProjectRow & { role: ProjectRole }>('projects as p')
      .join('project_members as m', 'm.project_id', 'p.id')
      .where('m.user_id', userId)
      .select('p.*', 'm.role')
      .orderBy([{ column: 'p.archived' }, { column: 'p.updated_at', order: 'desc' }]),
  /** A site administrator sees every project (to manage membership), with their role where they have one. */
  listAll: (db: Tx, userId: string) =>
    db<ProjectRow & { role: ProjectRole | null }>('projects as p')
      .leftJoin('project_members as m', (j) => j.on('m.project_id', 'p.id').andOnVal('m.user_id', userId))
      .select('p.*', 'm.role')
      .orderBy([{ column: 'p.archived' }, { column: 'p.updated_at', order: 'desc' }]),
  findById: (db: Tx, id: string) => db<ProjectRow>('projects').where({ id }).first(),
  async insert(
    db: Tx,
    values: Omit<ProjectRow, 'id' | 'version' | 'created_at' | 'updated_at' | 'archived' | 'permit'> & { permit?: string } & { created_by: string },
  ) {
    const [row] = await db<ProjectRow>('projects').insert(values).returning('*');
    return row;
  },
  async update(
    db: Tx,
    id: string,
    version: number,
    values: Partial<Omit<ProjectRow, 'id' | 'version' | 'created_at' | 'updated_at' | 'permit'>> & { permit?: string },
  ) {
    const [row] = await db<ProjectRow>('projects')
      .where({ id, version })
      .update({ ...values, version: db.raw('version + 1'), updated_at: db.fn.now() } as never)
      .returning('*');
    return row as ProjectRow | undefined;
  },
};

export const membersRepo = {
  roleOf: async (db: Tx, projectId: string, userId: string): Promise<ProjectRole | undefined> =>
    (await db('project_members').where({ project_id: projectId, user_id: userId }).first('role'))?.role,
  async list(db: Tx, projectId: string): Promise<Member[]> {
    const rows = await db<MemberRow>('project_members as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where('m.project_id', projectId)
      .select('m.user_id', 'u.email', 'u.name', 'm.role', 'm.added_at')
      .orderBy([{ column: 'm.role' }, { column: 'u.name' }]);
    return rows.map(toMember);
  },
  async find(db: Tx, projectId: string, userId: string): Promise<Member | undefined> {
    const row = await db<MemberRow>('project_members as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where({ 'm.project_id': projectId, 'm.user_id': userId })
      .first('m.user_id', 'u.email', 'u.name', 'm.role', 'm.added_at');
    return row ? toMember(row) : undefined;
  },
  /** Inserts unless already a member; returns false on a duplicate. */
  async insert(db: Tx, projectId: string, userId: string, role: ProjectRole): Promise<boolean> {
    const rows = await db('project_members')
      .insert({ project_id: projectId, user_id: userId, role })
      .onConflict(['project_id', 'user_id'])
      .ignore()
      .returning('user_id');
    return rows.length === 1;
  },
  setRole: (db: Tx, projectId: string, userId: string, role: ProjectRole) =>
    db('project_members').where({ project_id: projectId, user_id: userId }).update({ role }),
  remove: (db: Tx, projectId: string, userId: string) => db('project_members').where({ project_id: projectId, user_id: userId }).delete(),
  /** Locks the project's designer rows so two concurrent removals cannot both leave none. */
  async designerIdsForUpdate(db: Tx, projectId: string): Promise<string[]> {
    const rows = await db('project_members').where({ project_id: projectId, role: 'designer' }).forUpdate().select('user_id');
    return rows.map((r: { user_id: string }) => r.user_id);
  },
};
