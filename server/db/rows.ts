import type { Knex } from 'knex';

/** A repository function takes the database or a transaction, so a service can group writes. */
export type Tx = Knex | Knex.Transaction;

export const iso = (d: Date | string) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString());
