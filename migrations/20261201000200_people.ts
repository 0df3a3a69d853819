// Invitations, password resets, the append-only audit trail and the lab's settings.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('labs', (t) => {
    t.text('report_footer').notNullable().defaultTo('');
    t.bigInteger('updated_at');
  });
  await knex.schema.createTable('invitations', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
    t.string('email').notNullable();
    t.string('role').notNullable();
    t.string('token_hash').notNullable().unique();
    t.string('invited_by').references('users.id').onDelete('SET NULL');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('expires_at').notNullable();
    t.bigInteger('used_at');
    t.string('accepted_user_id').references('users.id').onDelete('SET NULL');
    t.bigInteger('revoked_at');
    t.index(['lab_id', 'created_at']);
    t.index(['lab_id', 'email']);
  });
  await knex.schema.createTable('password_resets', (t) => {
    t.string('id').primary();
    t.string('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.string('token_hash').notNullable().unique();
    t.bigInteger('created_at').notNullable();
    t.bigInteger('expires_at').notNullable();
    t.bigInteger('used_at');
    t.index(['user_id']);
  });
  // No foreign keys on purpose: the trail outlives what it names, and a cascading delete or
  // SET NULL would be an UPDATE/DELETE the triggers below refuse.
  await knex.schema.createTable('audit_events', (t) => {
    t.integer('id').primary();
    t.string('lab_id');
    t.string('actor_user_id');
    t.string('action').notNullable();
    t.string('target_type').notNullable();
    t.string('target_id');
    t.text('before_json');
    t.text('after_json');
    t.bigInteger('at').notNullable();
    t.string('prev_hash');
    t.string('hash').notNullable();
    t.index(['lab_id', 'id']);
    t.index(['lab_id', 'action', 'id']);
    t.index(['lab_id', 'actor_user_id', 'id']);
    t.index(['lab_id', 'at']);
  });
  await knex.raw(`CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events
    BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: UPDATE refused'); END`);
  await knex.raw(`CREATE TRIGGER audit_events_no_delete BEFORE DELETE ON audit_events
    BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: DELETE refused'); END`);
  await knex.schema.alterTable('memberships', (t) => {
    t.index(['lab_id', 'role']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS audit_events_no_update');
  await knex.raw('DROP TRIGGER IF EXISTS audit_events_no_delete');
  for (const t of ['audit_events', 'password_resets', 'invitations']) await knex.schema.dropTableIfExists(t);
  await knex.schema.alterTable('memberships', (t) => t.dropIndex(['lab_id', 'role']));
  await knex.schema.alterTable('labs', (t) => {
    t.dropColumn('report_footer');
    t.dropColumn('updated_at');
  });
}
