import type { Tx } from '../db/rows';

/**
 * The session store's table (connect-pg-simple, made by the first migration): passport keeps the
 * signed-in user's id at sess.passport.user.
 */
export const sessionsRepo = {
  /** Ends every session of the user (each of their browsers is signed out at its next request); returns how many. */
  endAllOf: (db: Tx, userId: string): Promise<number> => db('session').whereRaw(`(sess->'passport'->>'user') = ?`, [userId]).delete(),
};
