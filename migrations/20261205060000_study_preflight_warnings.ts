// The pre-flight warnings of a study's recipe on its scenarios, stored as they were when the study
// started (JSON array of findings; null for studies started before the check existed).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('studies', (t) => {
    t.text('preflight_warnings');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('studies', (t) => {
    t.dropColumn('preflight_warnings');
  });
}
