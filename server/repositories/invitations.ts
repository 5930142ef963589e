import type { Tx } from '../db/rows';

export interface InvitationRow {
  id: string;
  user_id: string;
  purpose: 'invitation' | 'password-reset';
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
}

export const invitationsRepo = {
  async insert(db: Tx, values: { user_id: string; token_hash: string; expires_at: Date; created_by: string | null; purpose?: InvitationRow['purpose'] }) {
    const [row] = await db<InvitationRow>('invitations').insert(values).returning('*');
    return row;
  },
  /** An earlier link stops working when a new one is issued. */
  revokeOpen: (db: Tx, userId: string) => db('invitations').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.fn.now() }),
  findUsable: (db: Tx, tokenHash: string) =>
    db<InvitationRow>('invitations').where({ token_hash: tokenHash }).whereNull('used_at').where('expires_at', '>', db.fn.now()).first(),
  /** Marks the link used; false when another request used it first (single use under concurrency). */
  async consume(db: Tx, id: string): Promise<boolean> {
    const n = await db('invitations').where({ id }).whereNull('used_at').update({ used_at: db.fn.now() });
    return n === 1;
  },
};
