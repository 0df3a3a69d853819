// Controlled reports: one report (document_id) per lab, kind and target, with numbered revisions.
// A row is one revision: its content as stored, its sha256, and what changed from the revision
// before it. A report made again from unchanged data finds its latest revision; a new revision is
// appended only when the content changes (and a content may come back in a later revision, so the
// old unique key on the content's hash goes). Rows stay append-only.
//
// SQLite cannot drop a unique constraint in place: the table is rebuilt and the rows copied, each
// target's rows numbered by time, the first row's id becoming the report's id (so a report id
// filed before this migration still finds its report).
import type { Knex } from 'knex';

async function dropGuards(knex: Knex) {
  await knex.raw('DROP TRIGGER IF EXISTS reports_no_update');
  await knex.raw('DROP TRIGGER IF EXISTS reports_no_delete');
}

async function addGuards(knex: Knex) {
  await knex.raw(`CREATE TRIGGER reports_no_update BEFORE UPDATE ON reports
    BEGIN SELECT RAISE(ABORT, 'reports is append-only: UPDATE refused'); END`);
  await knex.raw(`CREATE TRIGGER reports_no_delete BEFORE DELETE ON reports
    BEGIN SELECT RAISE(ABORT, 'reports is append-only: DELETE refused'); END`);
}

export async function up(knex: Knex): Promise<void> {
  await dropGuards(knex);
  await knex.schema.createTable('reports_revised', (t) => {
    t.string('id').primary();
    t.string('document_id').notNullable();
    t.integer('revision').notNullable();
    t.string('lab_id').notNullable().references('labs.id');
    t.string('kind').notNullable(); // study | standard
    t.string('target_id').notNullable();
    t.string('sha256').notNullable();
    t.text('content_json'); // null only for revisions recorded before contents were stored
    t.text('changes_json').notNullable().defaultTo('[]');
    t.string('created_by').references('users.id');
    t.bigInteger('created_at').notNullable();
    t.unique(['lab_id', 'kind', 'target_id', 'revision']);
    t.unique(['document_id', 'revision']);
    t.index(['lab_id', 'created_at']);
  });
  await knex.raw(`INSERT INTO reports_revised (id, document_id, revision, lab_id, kind, target_id, sha256, content_json, changes_json, created_by, created_at)
    SELECT id,
      FIRST_VALUE(id) OVER (PARTITION BY lab_id, kind, target_id ORDER BY created_at, id),
      ROW_NUMBER() OVER (PARTITION BY lab_id, kind, target_id ORDER BY created_at, id),
      lab_id, kind, target_id, sha256, NULL, '[]', created_by, created_at
    FROM reports`);
  await knex.schema.dropTable('reports');
  await knex.schema.renameTable('reports_revised', 'reports');
  await addGuards(knex);
}

export async function down(knex: Knex): Promise<void> {
  await dropGuards(knex);
  await knex.schema.createTable('reports_single', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id');
    t.string('kind').notNullable();
    t.string('target_id').notNullable();
    t.string('sha256').notNullable();
    t.string('created_by').references('users.id');
    t.bigInteger('created_at').notNullable();
    t.unique(['lab_id', 'kind', 'target_id', 'sha256']);
    t.index(['lab_id', 'created_at']);
  });
  // A content that came back in a later revision keeps its first row.
  await knex.raw(`INSERT OR IGNORE INTO reports_single (id, lab_id, kind, target_id, sha256, created_by, created_at)
    SELECT id, lab_id, kind, target_id, sha256, created_by, created_at FROM reports ORDER BY revision`);
  await knex.schema.dropTable('reports');
  await knex.schema.renameTable('reports_single', 'reports');
  await addGuards(knex);
}
