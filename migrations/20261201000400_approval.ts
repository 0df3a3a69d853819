// Approval and evidence: the lifecycle state of each recipe version, review submissions with
// their evidence studies, reviewers' decisions (electronic signatures), the lab's register of
// approved standards, and the registry of validation reports (id + sha256 of each content).
//
// Immutability lives in the database as well as in the services: SQLite triggers refuse any
// change of an approved version's body, a state change outside the lifecycle, any UPDATE or
// DELETE of submissions, evidence, decisions and reports, a decision by the submitter or the
// version's author, and any change of a standard's scope or signature.
import type { Knex } from 'knex';

const FROZEN_STATES = "('approved', 'retired', 'superseded')";

/** Triggers that refuse every UPDATE and DELETE of a table. */
async function appendOnly(knex: Knex, table: string) {
  await knex.raw(`CREATE TRIGGER ${table}_no_update BEFORE UPDATE ON ${table}
    BEGIN SELECT RAISE(ABORT, '${table} is append-only: UPDATE refused'); END`);
  await knex.raw(`CREATE TRIGGER ${table}_no_delete BEFORE DELETE ON ${table}
    BEGIN SELECT RAISE(ABORT, '${table} is append-only: DELETE refused'); END`);
}

export async function up(knex: Knex): Promise<void> {
  // draft → in_review → approved | returned; returned → in_review (resubmitted as it is);
  // approved → retired | superseded. An edit of any version appends a new version (draft).
  await knex.schema.alterTable('recipe_versions', (t) => {
    t.string('state').notNullable().defaultTo('draft');
    t.bigInteger('state_changed_at');
  });
  await knex.raw(`CREATE TRIGGER recipe_versions_new_is_draft BEFORE INSERT ON recipe_versions
    WHEN NEW.state IS NOT 'draft'
    BEGIN SELECT RAISE(ABORT, 'recipe_versions: a new version starts as a draft'); END`);
  await knex.raw(`CREATE TRIGGER recipe_versions_approved_frozen BEFORE UPDATE ON recipe_versions
    WHEN OLD.state IN ${FROZEN_STATES} AND (
      NEW.body IS NOT OLD.body OR NEW.name IS NOT OLD.name OR NEW.note IS NOT OLD.note
      OR NEW.recipe_id IS NOT OLD.recipe_id OR NEW.version IS NOT OLD.version
      OR NEW.author_id IS NOT OLD.author_id OR NEW.created_at IS NOT OLD.created_at)
    BEGIN SELECT RAISE(ABORT, 'recipe_versions: an approved version is immutable; an edit makes a new draft version'); END`);
  await knex.raw(`CREATE TRIGGER recipe_versions_state_rules BEFORE UPDATE OF state ON recipe_versions
    WHEN NEW.state IS NOT OLD.state AND NOT (
      (OLD.state IN ('draft', 'returned') AND NEW.state = 'in_review')
      OR (OLD.state = 'in_review' AND NEW.state IN ('approved', 'returned'))
      OR (OLD.state = 'approved' AND NEW.state IN ('retired', 'superseded')))
    BEGIN SELECT RAISE(ABORT, 'recipe_versions: this state change is outside the review lifecycle'); END`);
  await knex.raw(`CREATE TRIGGER recipe_versions_approved_no_delete BEFORE DELETE ON recipe_versions
    WHEN OLD.state IN ${FROZEN_STATES}
    BEGIN SELECT RAISE(ABORT, 'recipe_versions: an approved version cannot be deleted'); END`);

  // Foreign keys without cascades on purpose (as for audit_events): the evidence outlives what
  // it names, and a cascading delete would be a DELETE the triggers refuse.
  await knex.schema.createTable('review_submissions', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id');
    t.string('recipe_id').notNullable();
    t.integer('recipe_version').notNullable();
    t.text('scope_json').notNullable();
    t.string('structure_type').notNullable();
    t.text('purpose').notNullable();
    t.text('justification');
    t.text('coverage_json').notNullable();
    t.text('failing_json').notNullable();
    t.string('submitted_by').notNullable().references('users.id');
    t.bigInteger('submitted_at').notNullable();
    t.foreign(['recipe_id', 'recipe_version']).references(['recipe_id', 'version']).inTable('recipe_versions');
    t.index(['lab_id', 'submitted_at']);
    t.index(['recipe_id', 'recipe_version']);
  });
  await knex.schema.createTable('review_evidence', (t) => {
    t.string('submission_id').notNullable().references('review_submissions.id');
    t.integer('position').notNullable();
    t.string('study_id').notNullable().references('studies.id');
    t.primary(['submission_id', 'position']);
    t.unique(['submission_id', 'study_id']);
    t.index(['study_id']);
  });
  await knex.schema.createTable('review_decisions', (t) => {
    t.string('id').primary();
    t.string('submission_id').notNullable().unique().references('review_submissions.id');
    t.string('lab_id').notNullable().references('labs.id');
    t.string('reviewer_id').notNullable().references('users.id');
    t.string('decision').notNullable();
    t.text('meaning');
    t.text('comment').notNullable();
    t.text('reason');
    t.bigInteger('decided_at').notNullable();
    t.string('engine_version').notNullable();
    t.string('evidence_sha256').notNullable();
    t.string('signature_sha256').notNullable();
    t.index(['lab_id', 'decided_at']);
    t.index(['reviewer_id']);
  });
  await knex.raw(`CREATE TRIGGER review_decisions_rules BEFORE INSERT ON review_decisions
    WHEN NEW.decision NOT IN ('approved', 'returned')
      OR (NEW.decision = 'approved' AND (NEW.meaning IS NULL OR trim(NEW.meaning) = ''))
      OR (NEW.decision = 'returned' AND (NEW.reason IS NULL OR trim(NEW.reason) = ''))
    BEGIN SELECT RAISE(ABORT, 'review_decisions: approved needs a meaning, returned needs a reason'); END`);
  await knex.raw(`CREATE TRIGGER review_decisions_independent BEFORE INSERT ON review_decisions
    WHEN NEW.reviewer_id = (SELECT submitted_by FROM review_submissions WHERE id = NEW.submission_id)
      OR NEW.reviewer_id IN (SELECT v.author_id FROM review_submissions s
        JOIN recipe_versions v ON v.recipe_id = s.recipe_id AND v.version <= s.recipe_version
        WHERE s.id = NEW.submission_id)
    BEGIN SELECT RAISE(ABORT, 'review_decisions: the submitter or an author of the version cannot decide it'); END`);

  await knex.schema.createTable('standards', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id');
    t.string('recipe_id').notNullable();
    t.integer('recipe_version').notNullable();
    t.string('submission_id').notNullable().references('review_submissions.id');
    t.string('decision_id').notNullable().unique().references('review_decisions.id');
    t.string('structure_type').notNullable();
    t.float('band_low_hz').notNullable();
    t.float('band_high_hz').notNullable();
    t.float('damping_min_percent').notNullable();
    t.float('damping_max_percent').notNullable();
    t.string('excitations').notNullable(); // ",random,chirp," so that LIKE '%,kind,%' selects one
    t.bigInteger('effective_at').notNullable();
    t.bigInteger('review_due_at').notNullable();
    t.string('status').notNullable(); // active | retired | superseded
    t.string('supersedes_id');
    t.string('superseded_by_id');
    t.bigInteger('ended_at');
    t.string('ended_by');
    t.text('end_reason');
    t.bigInteger('reminded_for_due_at');
    t.unique(['recipe_id', 'recipe_version']);
    t.foreign(['recipe_id', 'recipe_version']).references(['recipe_id', 'version']).inTable('recipe_versions');
    t.index(['lab_id', 'status', 'structure_type']);
    t.index(['lab_id', 'review_due_at']);
    t.index(['status', 'review_due_at']);
  });
  await knex.raw(`CREATE TRIGGER standards_signed_frozen BEFORE UPDATE ON standards
    WHEN NEW.id IS NOT OLD.id OR NEW.lab_id IS NOT OLD.lab_id OR NEW.recipe_id IS NOT OLD.recipe_id
      OR NEW.recipe_version IS NOT OLD.recipe_version OR NEW.submission_id IS NOT OLD.submission_id
      OR NEW.decision_id IS NOT OLD.decision_id OR NEW.structure_type IS NOT OLD.structure_type
      OR NEW.band_low_hz IS NOT OLD.band_low_hz OR NEW.band_high_hz IS NOT OLD.band_high_hz
      OR NEW.damping_min_percent IS NOT OLD.damping_min_percent OR NEW.damping_max_percent IS NOT OLD.damping_max_percent
      OR NEW.excitations IS NOT OLD.excitations OR NEW.effective_at IS NOT OLD.effective_at
      OR NEW.review_due_at IS NOT OLD.review_due_at OR NEW.supersedes_id IS NOT OLD.supersedes_id
      OR (OLD.superseded_by_id IS NOT NULL AND NEW.superseded_by_id IS NOT OLD.superseded_by_id)
      OR (OLD.status IS NOT 'active' AND NEW.status IS NOT OLD.status)
      OR (NEW.status IS NOT OLD.status AND NEW.status NOT IN ('retired', 'superseded'))
    BEGIN SELECT RAISE(ABORT, 'standards: scope, signature and dates are immutable; only an active standard can end'); END`);
  await knex.raw(`CREATE TRIGGER standards_no_delete BEFORE DELETE ON standards
    BEGIN SELECT RAISE(ABORT, 'standards: DELETE refused (retire instead)'); END`);

  await knex.schema.createTable('reports', (t) => {
    t.string('id').primary();
    t.string('lab_id').notNullable().references('labs.id');
    t.string('kind').notNullable(); // study | standard
    t.string('target_id').notNullable();
    t.string('sha256').notNullable();
    t.string('created_by').references('users.id');
    t.bigInteger('created_at').notNullable();
    t.unique(['lab_id', 'kind', 'target_id', 'sha256']);
    t.index(['lab_id', 'created_at']);
  });

  for (const table of ['review_submissions', 'review_evidence', 'review_decisions', 'reports']) await appendOnly(knex, table);
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['review_submissions', 'review_evidence', 'review_decisions', 'reports']) {
    await knex.raw(`DROP TRIGGER IF EXISTS ${table}_no_update`);
    await knex.raw(`DROP TRIGGER IF EXISTS ${table}_no_delete`);
  }
  for (const trigger of [
    'standards_no_delete',
    'standards_signed_frozen',
    'review_decisions_independent',
    'review_decisions_rules',
    'recipe_versions_approved_no_delete',
    'recipe_versions_state_rules',
    'recipe_versions_approved_frozen',
    'recipe_versions_new_is_draft',
  ]) {
    await knex.raw(`DROP TRIGGER IF EXISTS ${trigger}`);
  }
  for (const t of ['reports', 'standards', 'review_decisions', 'review_evidence', 'review_submissions']) await knex.schema.dropTableIfExists(t);
  await knex.schema.alterTable('recipe_versions', (t) => {
    t.dropColumn('state_changed_at');
    t.dropColumn('state');
  });
}
