// The lab's work: versioned systems, scenarios and recipes; studies with their runs and result
// curves; uploads; and the job queue that drives background studies.
//
// Versioning: one head row per resource (its lab, the latest version number, list columns) and
// one immutable row per version (the validated JSON body, author, time). An update appends a
// version; nothing is ever rewritten, so every old version stays readable.
import type { Knex } from 'knex';

const VERSIONED = ['systems', 'scenarios', 'recipes'] as const;
const singular = { systems: 'system', scenarios: 'scenario', recipes: 'recipe' } as const;

export async function up(knex: Knex): Promise<void> {
  for (const table of VERSIONED) {
    await knex.schema.createTable(table, (t) => {
      t.string('id').primary();
      t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
      t.string('name').notNullable();
      t.string('description').notNullable().defaultTo('');
      t.integer('latest_version').notNullable();
      t.string('created_by').notNullable().references('users.id');
      t.string('updated_by').notNullable().references('users.id');
      t.bigInteger('created_at').notNullable();
      t.bigInteger('updated_at').notNullable();
      // The list screens sort by name or by last change and filter by name, always within a lab.
      t.index(['lab_id', 'name']);
      t.index(['lab_id', 'updated_at']);
      t.index(['lab_id', 'created_at']);
    });
    const fk = `${singular[table]}_id`;
    await knex.schema.createTable(`${singular[table]}_versions`, (t) => {
      t.string(fk).notNullable().references(`${table}.id`).onDelete('CASCADE');
      t.integer('version').notNullable();
      t.string('name').notNullable();
      t.text('body').notNullable();
      t.string('note').notNullable().defaultTo('');
      t.string('author_id').notNullable().references('users.id');
      t.bigInteger('created_at').notNullable();
      t.primary([fk, 'version']);
    });
  }

  await knex.schema.createTable('studies', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
    t.string('name').notNullable();
    t.string('recipe_id').notNullable();
    t.integer('recipe_version').notNullable();
    t.integer('seeds').notNullable();
    t.integer('base_seed').notNullable();
    t.string('status').notNullable(); // queued | running | finished | failed | cancelled
    t.integer('runs_done').notNullable().defaultTo(0);
    t.integer('runs_failed').notNullable().defaultTo(0);
    t.integer('runs_total').notNullable();
    t.string('current_scenario_id');
    t.string('engine_version').notNullable();
    t.text('summary'); // JSON: per scenario criteria and pass/fail, set when finished
    t.text('error');
    t.string('created_by').notNullable().references('users.id');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('started_at');
    t.bigInteger('finished_at');
    t.bigInteger('cancel_requested_at');
    t.foreign(['recipe_id', 'recipe_version']).references(['recipe_id', 'version']).inTable('recipe_versions');
    t.index(['lab_id', 'created_at']);
    t.index(['lab_id', 'status', 'created_at']);
    t.index(['lab_id', 'name']);
    t.index(['status']);
  });

  // The scenario versions of a study, in the fixed order runs and results use.
  await knex.schema.createTable('study_scenarios', (t) => {
    t.string('study_id').notNullable().references('studies.id').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.string('scenario_id').notNullable();
    t.integer('scenario_version').notNullable();
    t.primary(['study_id', 'position']);
    t.unique(['study_id', 'scenario_id']);
    t.foreign(['scenario_id', 'scenario_version']).references(['scenario_id', 'version']).inTable('scenario_versions');
  });

  await knex.schema.createTable('runs', (t) => {
    t.increments('id').primary();
    t.string('study_id').notNullable().references('studies.id').onDelete('CASCADE');
    t.string('scenario_id').notNullable();
    t.integer('scenario_version').notNullable();
    t.integer('position').notNullable();
    t.integer('seed_index').notNullable();
    t.integer('seed').notNullable();
    t.string('status').notNullable(); // finished | failed
    t.text('summary'); // JSON: the run's band figures
    t.binary('line_scores'); // Float64 blob: the per-line scores aggregation is made from
    t.text('error');
    t.bigInteger('started_at').notNullable();
    t.bigInteger('finished_at').notNullable();
    t.unique(['study_id', 'scenario_id', 'seed_index']);
    t.index(['study_id', 'position', 'seed_index']);
    t.index(['study_id', 'status']);
  });

  await knex.schema.createTable('result_curves', (t) => {
    t.string('study_id').notNullable().references('studies.id').onDelete('CASCADE');
    t.string('scenario_id').notNullable();
    t.string('kind').notNullable();
    t.integer('length').notNullable();
    t.binary('data').notNullable(); // Float64 little-endian
    t.primary(['study_id', 'scenario_id', 'kind']);
  });

  await knex.schema.createTable('uploads', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id').onDelete('CASCADE');
    t.string('kind').notNullable(); // time-data | frf
    t.string('original_name').notNullable();
    t.string('stored_name').notNullable().unique(); // generated, under DATA_DIR/uploads
    t.integer('size_bytes').notNullable();
    t.string('sha256').notNullable();
    t.string('recipe_id');
    t.integer('recipe_version');
    t.string('scenario_id');
    t.integer('scenario_version');
    t.text('summary').notNullable(); // JSON: what was parsed and the result figures
    t.string('status').notNullable(); // stored
    t.string('created_by').notNullable().references('users.id');
    t.bigInteger('created_at').notNullable();
    t.index(['lab_id', 'created_at']);
    t.index(['lab_id', 'kind', 'created_at']);
    t.index(['lab_id', 'original_name']);
  });

  await knex.schema.createTable('jobs', (t) => {
    t.increments('id').primary();
    t.string('type').notNullable();
    t.text('payload').notNullable();
    t.string('status').notNullable(); // queued | running | done | failed | cancelled
    t.integer('attempts').notNullable().defaultTo(0);
    t.bigInteger('locked_at');
    t.text('progress');
    t.text('error');
    t.bigInteger('created_at').notNullable();
    t.bigInteger('updated_at').notNullable();
    t.index(['status', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of [
    'jobs',
    'uploads',
    'result_curves',
    'runs',
    'study_scenarios',
    'studies',
    'recipe_versions',
    'recipes',
    'scenario_versions',
    'scenarios',
    'system_versions',
    'systems',
  ]) {
    await knex.schema.dropTableIfExists(t);
  }
}
