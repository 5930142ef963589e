import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable().unique();
    t.text('name').notNullable();
    t.text('password_hash'); // null until the invitation is accepted
    t.boolean('is_admin').notNullable().defaultTo(false);
    t.text('account_role').notNullable().checkIn(['designer', 'contractor', 'inspector']);
    t.text('status').notNullable().defaultTo('invited').checkIn(['invited', 'active', 'disabled']);
    t.integer('version').notNullable().defaultTo(1);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  // Table layout required by connect-pg-simple (its table.sql).
  await knex.raw(`
    CREATE TABLE "session" (
      "sid" varchar NOT NULL COLLATE "default" PRIMARY KEY,
      "sess" json NOT NULL,
      "expire" timestamp(6) NOT NULL
    );
    CREATE INDEX "IDX_session_expire" ON "session" ("expire");
  `);

  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('purpose').notNullable().defaultTo('invitation').checkIn(['invitation', 'password-reset']);
    // only a SHA-256 of the token is stored: a database leak reveals no usable link
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.uuid('created_by').references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('projects', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('name').notNullable();
    t.text('address').notNullable().defaultTo('');
    t.text('code_basis').notNullable().defaultTo('');
    t.text('unit_system').notNullable().defaultTo('US').checkIn(['US', 'SI']);
    t.text('notes').notNullable().defaultTo('');
    t.boolean('archived').notNullable().defaultTo(false);
    t.integer('version').notNullable().defaultTo(1);
    t.uuid('created_by').references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('project_members', (t) => {
    t.uuid('project_id').notNullable().references('projects.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('role').notNullable().checkIn(['designer', 'contractor', 'inspector']);
    t.timestamp('added_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['project_id', 'user_id']);
    t.index(['user_id']);
  });

  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id');
    t.uuid('actor_id').references('users.id');
    t.uuid('project_id').references('projects.id').onDelete('SET NULL');
    t.text('action').notNullable();
    t.text('subject_type').notNullable();
    t.text('subject_id');
    t.jsonb('details').notNullable().defaultTo('{}');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['project_id', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['audit_log', 'project_members', 'projects', 'invitations', 'session', 'users']) {
    await knex.schema.dropTableIfExists(table);
  }
}
