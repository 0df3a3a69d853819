// Failed sign-in and reset-request counts, kept in SQLite so a restart does not reset the limits.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('attempts', (t) => {
    t.increments('id');
    t.string('key').notNullable();
    t.bigInteger('at').notNullable();
    t.index(['key', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('attempts');
}
