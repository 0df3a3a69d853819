// Independence of the signature:
// - member_role_changes: every role a member of a lab held, with who granted it and when
//   (from_role NULL = joined the lab, to_role NULL = left it). Append-only. It answers "did this
//   person hold the admin role in this lab within the last N days?" when they try to decide a
//   review. Filled here from the memberships and the members.change-role audit events there are.
// - the decision trigger now also refuses the author of any version of the recipe (later ones
//   too) and whoever started a study of the evidence.
// - review_decisions.admin_cooling_days: the cooling period the decision was checked against, so
//   the signature block states the rule it was signed under (NULL: signed before it was kept).
// - single-use links already stored in mail bodies of the outbox are withheld: only the
//   recipient's mailbox keeps a usable link (see server/mail/mailer.ts).
import type { Knex } from 'knex';

const TOKEN_LINK = /\/(accept-invitation|reset-password)\?token=[A-Za-z0-9_-]+/g;
const WITHHELD = '/$1?token=[withheld: only the recipient received this link]';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('member_role_changes', (t) => {
    t.increments('id').primary();
    t.string('lab_id').notNullable();
    t.string('user_id').notNullable();
    t.string('from_role');
    t.string('to_role');
    t.string('by_user_id');
    t.bigInteger('at').notNullable();
    t.index(['lab_id', 'user_id', 'at']);
  });
  for (const op of ['UPDATE', 'DELETE']) {
    await knex.raw(`CREATE TRIGGER member_role_changes_no_${op.toLowerCase()} BEFORE ${op} ON member_role_changes
      BEGIN SELECT RAISE(ABORT, 'member_role_changes is append-only: ${op} refused'); END`);
  }

  // History there is so far: role changes from the audit trail, then joins for those without one.
  const changes = await knex('audit_events').where({ action: 'members.change-role' }).orderBy('id').select('lab_id', 'target_id', 'actor_user_id', 'before_json', 'after_json', 'at');
  const seen = new Set<string>();
  for (const e of changes) {
    const from = e.before_json ? (JSON.parse(e.before_json).role ?? null) : null;
    const to = e.after_json ? (JSON.parse(e.after_json).role ?? null) : null;
    if (!e.lab_id || !e.target_id) continue;
    if (!seen.has(`${e.lab_id}/${e.target_id}`) && from) {
      // The member joined with the role held before the first change, at an unknown time: record it then.
      await knex('member_role_changes').insert({ lab_id: e.lab_id, user_id: e.target_id, from_role: null, to_role: from, by_user_id: null, at: Number(e.at) });
    }
    seen.add(`${e.lab_id}/${e.target_id}`);
    await knex('member_role_changes').insert({ lab_id: e.lab_id, user_id: e.target_id, from_role: from, to_role: to, by_user_id: e.actor_user_id, at: Number(e.at) });
  }
  for (const m of await knex('memberships').select('lab_id', 'user_id', 'role', 'created_at')) {
    if (seen.has(`${m.lab_id}/${m.user_id}`)) continue;
    await knex('member_role_changes').insert({ lab_id: m.lab_id, user_id: m.user_id, from_role: null, to_role: m.role, by_user_id: null, at: Number(m.created_at) });
  }

  await knex.schema.alterTable('review_decisions', (t) => t.integer('admin_cooling_days'));
  await knex.raw('DROP TRIGGER IF EXISTS review_decisions_independent');
  await knex.raw(`CREATE TRIGGER review_decisions_independent BEFORE INSERT ON review_decisions
    WHEN NEW.reviewer_id = (SELECT submitted_by FROM review_submissions WHERE id = NEW.submission_id)
      OR NEW.reviewer_id IN (SELECT v.author_id FROM review_submissions s
        JOIN recipe_versions v ON v.recipe_id = s.recipe_id
        WHERE s.id = NEW.submission_id)
      OR NEW.reviewer_id IN (SELECT st.created_by FROM review_evidence e
        JOIN studies st ON st.id = e.study_id
        WHERE e.submission_id = NEW.submission_id)
    BEGIN SELECT RAISE(ABORT, 'review_decisions: the submitter, an author of any version or the starter of an evidence study cannot decide it'); END`);

  for (const m of await knex('mail_outbox').where('body_text', 'like', '%?token=%').select('id', 'body_text')) {
    const redacted = String(m.body_text).replace(TOKEN_LINK, WITHHELD);
    if (redacted !== m.body_text) await knex('mail_outbox').where({ id: m.id }).update({ body_text: redacted });
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS review_decisions_independent');
  await knex.raw(`CREATE TRIGGER review_decisions_independent BEFORE INSERT ON review_decisions
    WHEN NEW.reviewer_id = (SELECT submitted_by FROM review_submissions WHERE id = NEW.submission_id)
      OR NEW.reviewer_id IN (SELECT v.author_id FROM review_submissions s
        JOIN recipe_versions v ON v.recipe_id = s.recipe_id AND v.version <= s.recipe_version
        WHERE s.id = NEW.submission_id)
    BEGIN SELECT RAISE(ABORT, 'review_decisions: the submitter or an author of the version cannot decide it'); END`);
  await knex.schema.alterTable('review_decisions', (t) => t.dropColumn('admin_cooling_days'));
  await knex.raw('DROP TRIGGER IF EXISTS member_role_changes_no_update');
  await knex.raw('DROP TRIGGER IF EXISTS member_role_changes_no_delete');
  await knex.schema.dropTableIfExists('member_role_changes');
  // Withheld links stay withheld: the tokens were never kept anywhere else.
}
