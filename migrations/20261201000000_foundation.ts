import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw('CREATE EXTENSION IF NOT EXISTS pgcrypto');

  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('role').notNullable();
    t.text('password_hash').notNullable();
    t.boolean('active').notNullable().defaultTo(true);
    t.text('unit').notNullable().defaultTo('mm');
    t.text('mail_mode').notNullable().defaultTo('instant');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`ALTER TABLE users
    ADD CONSTRAINT users_role_check CHECK (role IN ('owner','buyer','machinist','staff')),
    ADD CONSTRAINT users_unit_check CHECK (unit IN ('mm','in')),
    ADD CONSTRAINT users_mail_mode_check CHECK (mail_mode IN ('instant','digest','none')),
    ADD CONSTRAINT users_email_check CHECK (email = lower(email) AND position('@' in email) > 1)`);
  await knex.raw('CREATE UNIQUE INDEX users_email_unique ON users (email)');

  // express-session store (connect-pg-simple's layout).
  await knex.raw(`CREATE TABLE sessions (
    sid varchar NOT NULL PRIMARY KEY,
    sess json NOT NULL,
    expire timestamp(6) NOT NULL)`);
  await knex.raw('CREATE INDEX sessions_expire_idx ON sessions (expire)');
  await knex.raw(`CREATE INDEX sessions_user_idx ON sessions (((sess -> 'passport' ->> 'user')))`);

  await knex.schema.createTable('sign_in_failures', (t) => {
    t.bigIncrements('id');
    t.text('email').notNullable();
    t.text('address').notNullable();
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['email', 'address', 'at']);
  });

  await knex.schema.createTable('settings', (t) => {
    t.text('key').primary();
    t.jsonb('value').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('user_id').references('users.id');
    t.text('action').notNullable();
    t.text('entity').notNullable();
    t.text('entity_id');
    t.jsonb('before');
    t.jsonb('after');
    t.index(['entity', 'entity_id']);
    t.index(['at']);
  });
  // The audit trail is append-only: nobody edits history.
  await knex.raw(`CREATE FUNCTION refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION '% is append-only', TG_TABLE_NAME; END $$`);
  await knex.raw(`CREATE TRIGGER audit_events_append_only BEFORE UPDATE OR DELETE ON audit_events
    FOR EACH ROW EXECUTE FUNCTION refuse_change()`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_events');
  await knex.raw('DROP FUNCTION refuse_change() CASCADE');
  await knex.schema.dropTable('settings');
  await knex.schema.dropTable('sign_in_failures');
  await knex.raw('DROP TABLE sessions');
  await knex.schema.dropTable('users');
}
