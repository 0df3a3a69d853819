// Adaptive studies (JCGM 101 §7.9): a study may run its seeds in batches until every criterion's
// decision figure is stable. The option is stored with the study (JSON: batchSize,
// significantDigits; null for a fixed number of seeds, as every study before it); `seeds` is then
// the maximum per scenario. How many seeds each scenario used, and why it stopped, go to the
// study's summary JSON with its results.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('studies', (t) => {
    t.text('adaptive');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('studies', (t) => {
    t.dropColumn('adaptive');
  });
}
