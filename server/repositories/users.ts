import type { User } from '../../src/shared/api/auth';
import { iso, type Tx } from '../db/rows';

export interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string | null;
  is_admin: boolean;
  account_role: User['accountRole'];
  status: User['status'];
  version: number;
  created_at: Date;
}

export const toUser = (row: UserRow): User => ({
  id: row.id,
  email: row.email,
  name: row.name,
  isAdmin: row.is_admin,
  accountRole: row.account_role,
  status: row.status,
  version: row.version,
  createdAt: iso(row.created_at),
});

export const usersRepo = {
  findById: (db: Tx, id: string) => db<UserRow>('users').where({ id }).first(),
  /** The user and their role in one project (null when not a member), in one query: a request's sign-in and its project guard together. */
  findWithRole: (db: Tx, id: string, projectId: string) =>
    db('users as u')
      .leftJoin('project_members as m', (j) => j.on('m.user_id', 'u.id').andOn('m.project_id', db.raw('?', [projectId])))
      .where('u.id', id)
      .first('u.*', 'm.role as project_role') as Promise<(UserRow & { project_role: string | null }) | undefined>,
  findByEmail: (db: Tx, email: string) => db<UserRow>('users').where({ email: email.toLowerCase() }).first(),
  list: (db: Tx) => db<UserRow>('users').orderBy([{ column: 'is_admin', order: 'desc' }, 'name']),
  async insert(db: Tx, values: Pick<UserRow, 'email' | 'name' | 'is_admin' | 'account_role'> & Partial<Pick<UserRow, 'password_hash' | 'status'>>) {
    const [row] = await db<UserRow>('users')
      .insert({ ...values, email: values.email.toLowerCase() })
      .returning('*');
    return row;
  },
  /** Optimistic update: returns undefined when the version is stale. */
  async update(db: Tx, id: string, version: number, values: Partial<Omit<UserRow, 'id' | 'version' | 'created_at'>>) {
    const [row] = await db<UserRow>('users')
      .where({ id, version })
      .update({ ...values, version: db.raw('version + 1'), updated_at: db.fn.now() } as never)
      .returning('*');
    return row as UserRow | undefined;
  },
  async setPassword(db: Tx, id: string, passwordHash: string) {
    await db('users')
      .where({ id })
      .update({ password_hash: passwordHash, status: 'active', version: db.raw('version + 1'), updated_at: db.fn.now() });
  },
};
