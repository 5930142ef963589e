import type { Tx } from '../db/rows';

export interface PasswordResetRow {
  id: string;
  user_id: string;
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  requested_from: string | null;
  created_at: Date;
}

export const passwordResetsRepo = {
  async insert(db: Tx, values: Pick<PasswordResetRow, 'user_id' | 'token_hash' | 'expires_at' | 'requested_from'>): Promise<PasswordResetRow> {
    const [row] = await db<PasswordResetRow>('password_resets').insert(values).returning('*');
    return row as PasswordResetRow;
  },
  /** Unused and not yet expired (the database's clock decides, as for invitations). */
  findUsable: (db: Tx, tokenHash: string) =>
    db<PasswordResetRow>('password_resets').where({ token_hash: tokenHash }).whereNull('used_at').where('expires_at', '>', db.fn.now()).first(),
  /** Marks the link used; false when another request used it first (single use under concurrency). */
  async consume(db: Tx, id: string): Promise<boolean> {
    const n = await db('password_resets').where({ id }).whereNull('used_at').update({ used_at: db.fn.now() });
    return n === 1;
  },
  /** Spends every other open link of the user; returns how many. */
  revokeOpen: (db: Tx, userId: string): Promise<number> =>
    db('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.fn.now() }),
};
