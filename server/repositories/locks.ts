/**
 * Row locks, and the one order in which any transaction takes them. Two transactions that lock the
 * same rows in the same order wait for each other instead of deadlocking, so every service that
 * locks more than one kind of row goes through these functions in this order:
 *
 *   1. the system row          (issuing, new drafts, field changes on the system)
 *   2. the field change row    (a field change's transitions)
 *   3. revision rows           (a draft's save, issue's supersede)
 *
 * A transaction may skip a level, never go back up one.
 */
import type { Tx } from '../db/rows';
import type { FieldChangeRow } from './fieldChanges';

export const locks = {
  /** Level 1: serialises everything that changes which revision of a system is current. */
  system: async (db: Tx, systemId: string): Promise<void> => {
    await db('systems').where({ id: systemId }).forUpdate().first('id');
  },
  /** Level 2: a field change of the system, locked for its transition. */
  fieldChange: (db: Tx, projectId: string, systemId: string, id: string) =>
    db<FieldChangeRow>('field_changes').where({ id, project_id: projectId, system_id: systemId }).forUpdate().first() as Promise<FieldChangeRow | undefined>,
};
