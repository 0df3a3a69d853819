// Labs, people, their roles per lab, sign-in sessions and the mail outbox.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('labs', (t) => {
    t.string('id').primary();
    t.string('name').notNullable();
    t.string('slug').notNullable().unique();
    t.bigInteger('created_at').notNullable();
  });
  await knex.schema.createTable('users', (t) => {
    t.string('id').primary();
    t.string('email').notNullable().unique();
    t.string('display_name').notNullable();
    t.string('password_hash');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('disabled_at');
  });
  await knex.schema.createTable('memberships', (t) => {
    t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
    t.string('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.string('role').notNullable();
    t.bigInteger('created_at').notNullable();
    t.primary(['lab_id', 'user_id']);
    t.index(['user_id']);
  });
  await knex.schema.createTable('sessions', (t) => {
    t.string('id').primary();
    t.string('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.bigInteger('expires_at').notNullable();
    t.bigInteger('created_at').notNullable();
    t.index(['user_id']);
    t.index(['expires_at']);
  });
  await knex.schema.createTable('mail_outbox', (t) => {
    t.increments('id').primary();
    t.string('lab_id').references('labs.id').onDelete('SET NULL');
    t.string('to_address').notNullable();
    t.string('subject').notNullable();
    t.text('body_text').notNullable();
    t.string('kind').notNullable();
    t.string('status').notNullable();
    t.text('error');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('sent_at');
    t.index(['lab_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ['mail_outbox', 'sessions', 'memberships', 'users', 'labs']) await knex.schema.dropTableIfExists(t);
}
