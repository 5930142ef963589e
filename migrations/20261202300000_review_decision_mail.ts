/**
 * The outbox learns one more kind of message: the inspector's decision, sent to the designer who
 * sent the summary. The kind check is replaced whole (knex's checkIn made it unnamed).
 */
import type { Knex } from 'knex';

const KINDS = ['summary', 'invitation', 'password-reset', 'field-change', 'review-decision'];

async function replaceOutboxKinds(knex: Knex, kinds: string[]) {
  const { rows } = await knex.raw(
    `SELECT conname FROM pg_constraint WHERE conrelid = 'outbox'::regclass AND contype = 'c' AND pg_get_constraintdef(oid) LIKE '%kind%'`,
  );
  for (const r of rows as { conname: string }[]) await knex.raw('ALTER TABLE outbox DROP CONSTRAINT ??', [r.conname]);
  // DDL takes no bind parameters: the kinds are this file's own constants, checked to be plain words.
  if (!kinds.every((k) => /^[a-z-]+$/.test(k))) throw new Error('outbox kinds must be plain words');
  await knex.raw(`ALTER TABLE outbox ADD CONSTRAINT outbox_kind_check CHECK (kind IN (${kinds.map((k) => `'${k}'`).join(', ')}))`);
}

export async function up(knex: Knex): Promise<void> {
  await replaceOutboxKinds(knex, KINDS);
}

export async function down(knex: Knex): Promise<void> {
  await knex('outbox').where({ kind: 'review-decision' }).delete();
  await replaceOutboxKinds(
    knex,
    KINDS.filter((k) => k !== 'review-decision'),
  );
}
