/**
 * The independence of a review decision (ISO/IEC 17025:2017 §7.2.2 and §7.5 ask for results to be
 * checked by someone other than who produced them; electronic-record rules ask that a signature
 * be attributable to one person). Who may not decide a submission, and why, most basic first:
 *
 * - anyone whose role in the lab is not reviewer;
 * - the person who submitted it;
 * - anyone who wrote any version of the recipe (earlier or later than the submitted one);
 * - anyone who started a study of its evidence;
 * - anyone who held the admin role in this lab within the last N days
 *   (APPROVAL_ADMIN_COOLING_DAYS): administration and approval stay with different people.
 *
 * The decision service refuses with the first reason; the submission view lists them all, so
 * the reviewer's screen says why. docs/approval.md states the rules for a quality manager.
 */
import type { Role } from '@/shared/api/auth';
import { evidenceStudiesStartedBy, recipeAuthors, type SubmissionRow } from '../db/approval';
import type { Db } from '../db/knex';
import { lastLeftRole } from '../db/role-history';
import { AppError } from '../errors';

const DAY_MS = 86_400_000;

export interface IndependencePolicy {
  /** Days after holding the admin role before an account may decide. */
  adminCoolingDays: number;
  /** Now, ms since the epoch (the server's clock). */
  now: number;
}

/** What the rules look at, for one person and one submission. */
export interface IndependenceFacts {
  role: Role;
  submittedBy: string;
  recipeVersion: number;
  /** Versions of the recipe this person wrote. */
  versionsWritten: number[];
  /** Evidence studies this person started. */
  studiesStarted: { id: string; name: string }[];
  /** When this person last gave up the admin role in this lab (null: never held it or holds it). */
  leftAdminAt: number | null;
}

/** The rule in one sentence, as the reviewer's screen and the report's signature block state it. */
export const independenceRule = (coolingDays: number) =>
  `No one may decide a review who submitted it, wrote any version of its recipe or started a study of its evidence; an admin cannot give itself a role that decides reviews, and an account that held the admin role in this lab within the last ${coolingDays} days cannot decide one.`;

export async function independenceFacts(db: Db, sub: Pick<SubmissionRow, 'id' | 'recipe_id' | 'recipe_version' | 'submitted_by' | 'lab_id'>, userId: string, role: Role): Promise<IndependenceFacts> {
  const authors = await recipeAuthors(db, sub.recipe_id);
  return {
    role,
    submittedBy: sub.submitted_by,
    recipeVersion: sub.recipe_version,
    versionsWritten: authors.filter((a) => a.author_id === userId).map((a) => a.version),
    studiesStarted: await evidenceStudiesStartedBy(db, sub.id, userId),
    leftAdminAt: await lastLeftRole(db, sub.lab_id, userId, 'admin'),
  };
}

const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const list = (items: string[]) => (items.length < 2 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`);

/** Why this person may not decide the submission (empty when they may), most basic first. */
export function independenceRefusals(f: IndependenceFacts, userId: string, policy: IndependencePolicy): AppError[] {
  const out: AppError[] = [];
  if (f.role !== 'reviewer') {
    out.push(new AppError(403, 'forbidden', `Only a reviewer may approve or return a submission; your role in this lab is ${f.role}.`));
  }
  if (f.submittedBy === userId) {
    out.push(new AppError(403, 'self_approval', 'You submitted this recipe version for review: an independent reviewer must decide it.'));
  }
  const later = f.versionsWritten.filter((v) => v > f.recipeVersion);
  const earlier = f.versionsWritten.filter((v) => v < f.recipeVersion);
  if (f.versionsWritten.includes(f.recipeVersion)) {
    out.push(new AppError(403, 'author_cannot_decide', `You wrote version ${f.recipeVersion} of this recipe: a reviewer who is not its author must decide it.`));
  } else if (f.versionsWritten.length) {
    const which = [...(earlier.length ? [`version ${list(earlier.map(String))}, which version ${f.recipeVersion} builds on`] : []), ...(later.length ? [`version ${list(later.map(String))}, a later edit of it`] : [])];
    out.push(new AppError(403, 'editor_cannot_decide', `You wrote ${which.join(', and ')}: a reviewer who wrote no version of this recipe must decide it.`));
  }
  if (f.studiesStarted.length) {
    const names = list(f.studiesStarted.map((s) => `"${s.name}"`));
    out.push(new AppError(403, 'evidence_author_cannot_decide', `You started the evidence ${f.studiesStarted.length === 1 ? 'study' : 'studies'} ${names}: a reviewer who produced none of the evidence must decide it.`));
  }
  const coolingEnds = f.leftAdminAt === null ? null : f.leftAdminAt + policy.adminCoolingDays * DAY_MS;
  if (coolingEnds !== null && coolingEnds > policy.now) {
    out.push(
      new AppError(403, 'admin_cooling', `You held the admin role in this lab until ${day(f.leftAdminAt!)}: an account may decide reviews only ${policy.adminCoolingDays} days after its last day as admin (from ${day(coolingEnds)}).`),
    );
  }
  return out;
}
