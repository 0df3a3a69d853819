// Sweep studies: one recipe version on one scenario version with one or two settings varied over
// a grid. The definition (the axes) is stored as given; each grid point's recipe and scenario are
// derived from the stored versions by the engine (expandSweep), so nothing else needs storing to
// reproduce them. Runs are stored one row per (point, seed index), like a study's.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sweeps', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
    t.string('name').notNullable();
    t.string('recipe_id').notNullable();
    t.integer('recipe_version').notNullable();
    t.string('scenario_id').notNullable();
    t.integer('scenario_version').notNullable();
    t.text('axes').notNullable(); // JSON: [{ setting, values }]
    t.integer('points').notNullable();
    t.integer('seeds').notNullable();
    t.integer('base_seed').notNullable();
    t.string('status').notNullable(); // queued | running | finished | failed | cancelled
    t.integer('runs_done').notNullable().defaultTo(0);
    t.integer('runs_failed').notNullable().defaultTo(0);
    t.integer('runs_total').notNullable();
    t.string('engine_version').notNullable();
    t.text('summary'); // JSON: the judged points and the cheapest passing point, set at the end
    t.text('error');
    t.string('created_by').notNullable().references('users.id');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('started_at');
    t.bigInteger('finished_at');
    t.bigInteger('cancel_requested_at');
    t.foreign(['recipe_id', 'recipe_version']).references(['recipe_id', 'version']).inTable('recipe_versions');
    t.foreign(['scenario_id', 'scenario_version']).references(['scenario_id', 'version']).inTable('scenario_versions');
    t.index(['lab_id', 'created_at']);
    t.index(['status']);
  });
  await knex.schema.createTable('sweep_runs', (t) => {
    t.increments('id').primary();
    t.string('sweep_id').notNullable().references('sweeps.id').onDelete('CASCADE');
    t.integer('point').notNullable();
    t.integer('seed_index').notNullable();
    t.integer('seed').notNullable();
    t.string('status').notNullable(); // finished | failed
    t.binary('result'); // the engine's whole RunResult, packed exactly (db/float-blob)
    t.text('error');
    t.bigInteger('started_at').notNullable();
    t.bigInteger('finished_at').notNullable();
    t.unique(['sweep_id', 'point', 'seed_index']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sweep_runs');
  await knex.schema.dropTableIfExists('sweeps');
}
