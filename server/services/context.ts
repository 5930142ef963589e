import type { Db } from '../db/knex';
import type { Config } from '../config';

/** What every service needs, passed explicitly (no module state). */
export interface ServiceContext {
  db: Db;
  config: Config;
}

export interface Actor {
  id: string;
  isAdmin: boolean;
  accountRole: 'designer' | 'contractor' | 'inspector';
}
