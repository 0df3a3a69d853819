/**
 * Request and response schemas of approval and evidence: the lifecycle of recipe versions, review
 * submissions and decisions (electronic signatures), the lab's register of approved standards,
 * validation reports and re-verification. Times are milliseconds since the Unix epoch (UTC);
 * frequencies Hz; damping as a percentage of critical (1 % = ratio 0.01).
 */
import { z } from 'zod';
import { id, millis, pageOf, paging, person } from './common';
import { settingsSummarySchema } from './settings-summary';

// ---- lifecycle -------------------------------------------------------------------------------

export const RECIPE_STATES = ['draft', 'in_review', 'approved', 'returned', 'retired', 'superseded'] as const;
export const recipeStateSchema = z.enum(RECIPE_STATES);
export type RecipeState = z.infer<typeof recipeStateSchema>;

export const recipeLifecycleSchema = z.object({
  recipeId: z.string(),
  name: z.string(),
  latestVersion: z.number().int(),
  versions: z.array(
    z.object({
      version: z.number().int(),
      state: recipeStateSchema,
      author: person,
      createdAt: millis,
      stateChangedAt: millis.nullable(),
      /** The newest submission of this version, and the standard it became, if any. */
      submissionId: z.string().nullable(),
      standardId: z.string().nullable(),
    }),
  ),
});
export type RecipeLifecycle = z.infer<typeof recipeLifecycleSchema>;

// ---- scope and submissions -------------------------------------------------------------------

export const EXCITATION_KINDS = ['random', 'burst-random', 'periodic-random', 'pseudo-random', 'chirp', 'impact'] as const;
export const excitationKindSchema = z.enum(EXCITATION_KINDS);

/** The kind of structure a recipe is put forward for, as the lab names and bounds it. */
export const scopeSchema = z.object({
  /** The lab's own label, e.g. "lightly damped frame"; matched as text in the register. */
  structureType: z.string().trim().min(2, 'Name the structure type').max(120),
  band: z
    .object({ lowHz: z.number().min(0), highHz: z.number().positive() })
    .refine((b) => b.lowHz < b.highHz, { path: ['lowHz'], message: 'lowHz must be below highHz' }),
  dampingPercent: z
    .object({ min: z.number().gt(0).lt(100), max: z.number().gt(0).lt(100) })
    .refine((d) => d.min <= d.max, { path: ['min'], message: 'min must not exceed max' }),
  excitations: z
    .array(excitationKindSchema)
    .min(1)
    .max(EXCITATION_KINDS.length)
    .refine((a) => new Set(a).size === a.length, 'Each excitation may appear only once'),
});
export type Scope = z.infer<typeof scopeSchema>;

export const submitReviewSchema = z.object({
  recipe: z.object({ id, version: z.number().int().min(1) }),
  /** Finished studies of exactly this recipe version. */
  studyIds: z
    .array(id)
    .min(1, 'Give at least one finished study as evidence')
    .max(20)
    .refine((a) => new Set(a).size === a.length, 'Each study may appear only once'),
  scope: scopeSchema,
  purpose: z.string().trim().max(2000).default(''),
  /** Required when any criterion of the evidence failed: why the recipe is fit nonetheless. */
  justification: z.string().trim().max(4000).optional(),
});
export type SubmitReviewRequest = z.input<typeof submitReviewSchema>;

/** How the evidence's scenarios cover the declared scope (each check with its finding). */
export const coverageSchema = z.object({
  covered: z.boolean(),
  checks: z.array(z.object({ id: z.string(), ok: z.boolean(), detail: z.string() })),
});
export type Coverage = z.infer<typeof coverageSchema>;

export const failingCriterionSchema = z.object({
  studyId: z.string(),
  scenario: z.string(),
  label: z.string(),
  limit: z.number(),
  observed: z.number().nullable(),
  unit: z.string(),
});

/** How an account came to the lab: by an accepted invitation (from whom, when), or by the operator. */
export const accountOriginSchema = z.object({
  kind: z.enum(['invitation', 'operator']),
  /** The admin who sent the invitation (null for the operator, or an inviter since removed). */
  invitedBy: z.object({ id: z.string(), displayName: z.string(), email: z.string() }).nullable(),
  /** When the invitation was sent (null for the operator). */
  invitedAt: millis.nullable(),
  /** When the account joined the lab. */
  joinedAt: millis.nullable(),
  /** The same in words, e.g. "invited by Mara Okafor (admin@harborridge.test) on 2026-12-05, accepted 2026-12-06". */
  text: z.string(),
});
export type AccountOrigin = z.infer<typeof accountOriginSchema>;

/** Who signed: the name and the e-mail of the account, and how it came to the lab. */
export const signerSchema = z.object({ id: z.string(), displayName: z.string(), email: z.string(), origin: accountOriginSchema });
export type Signer = z.infer<typeof signerSchema>;

export const signatureSchema = z.object({
  reviewer: person,
  signer: signerSchema,
  /** The independence and admin/approval separation rule the signature was checked against, in one sentence. */
  rule: z.string(),
  meaning: z.string(),
  comment: z.string(),
  signedAt: millis,
  engineVersion: z.string(),
  /** sha256 over the canonical JSON of the recipe version, the study results and the engine version. */
  evidenceSha256: z.string(),
  /** sha256 over the evidence hash, the signer, the meaning, the comment and the time. */
  signatureSha256: z.string(),
});
export type Signature = z.infer<typeof signatureSchema>;

export const decisionViewSchema = z.object({
  id: z.string(),
  decision: z.enum(['approved', 'returned']),
  reviewer: person,
  signer: signerSchema,
  meaning: z.string().nullable(),
  comment: z.string(),
  reason: z.string().nullable(),
  decidedAt: millis,
  engineVersion: z.string(),
  evidenceSha256: z.string(),
  signatureSha256: z.string(),
});

export const SUBMISSION_STATUSES = ['pending', 'approved', 'returned'] as const;

export const submissionSchema = z.object({
  id: z.string(),
  labId: z.string(),
  recipe: z.object({ id: z.string(), version: z.number().int(), name: z.string(), state: recipeStateSchema, latestVersion: z.number().int() }),
  /** A newer version of the recipe exists: this one can be returned but no longer approved. */
  stale: z.boolean(),
  scope: scopeSchema,
  purpose: z.string(),
  justification: z.string().nullable(),
  studies: z.array(z.object({ id: z.string(), name: z.string(), pass: z.boolean().nullable() })),
  coverage: coverageSchema,
  failingCriteria: z.array(failingCriterionSchema),
  submittedBy: person,
  submittedAt: millis,
  status: z.enum(SUBMISSION_STATUSES),
  decision: decisionViewSchema.nullable(),
  standardId: z.string().nullable(),
  /** The status of the standard it became (a retired standard is no longer the lab's). */
  standardStatus: z.enum(['active', 'retired', 'superseded']).nullable().default(null),
  /** A later submission of the same recipe (a returned one put forward again). */
  resubmittedAs: z.string().nullable().default(null),
  /** Why the signed-in user may not decide this submission (empty when they may). */
  blockedForYou: z.array(z.string()),
  /** The signed-in user the reasons above are about. */
  viewer: z.object({ id: z.string(), displayName: z.string(), email: z.string() }),
  /** The independence and admin/approval separation rule, in one sentence. */
  rule: z.string(),
});
export type Submission = z.infer<typeof submissionSchema>;

export const reviewListQuerySchema = z.object({
  ...paging,
  status: z.enum(SUBMISSION_STATUSES).optional(),
  recipeId: id.optional(),
});
export const reviewListSchema = pageOf(submissionSchema);

/** The evidence a reviewer reads: the submission, the recipe definition, each study's criteria. */
export const evidenceSchema = z.object({
  submission: submissionSchema,
  recipeDefinition: z.record(z.string(), z.unknown()),
  /** The recipe version's settings as labelled rows (null when its definition cannot be read). */
  settings: settingsSummarySchema.nullable().default(null),
  studies: z.array(
    z.object({
      id: z.string(),
      name: z.string(),
      engineVersion: z.string(),
      seeds: z.number().int(),
      baseSeed: z.number().int(),
      pass: z.boolean().nullable(),
      reportPath: z.string(),
      scenarios: z.array(
        z.object({
          id: z.string(),
          version: z.number().int(),
          name: z.string(),
          pass: z.boolean(),
          criteria: z.array(
            z.object({ id: z.string(), label: z.string(), limit: z.number(), observed: z.number().nullable(), unit: z.string(), pass: z.boolean(), worstLineHz: z.number().nullable() }),
          ),
          warnings: z.array(z.object({ message: z.string(), runs: z.number().int() })),
        }),
      ),
    }),
  ),
});
export type Evidence = z.infer<typeof evidenceSchema>;

export const decideSchema = z.discriminatedUnion('decision', [
  z.object({
    decision: z.literal('approved'),
    /** The reviewer's own password, entered again for this signature. */
    password: z.string().min(1, 'Enter your password to sign').max(500),
    /** What the signature means, e.g. "approved as lab standard for lightly damped frames, 10–500 Hz". */
    meaning: z.string().trim().min(10, 'State what the signature means (at least 10 characters)').max(500),
    comment: z.string().trim().max(4000).default(''),
    /** Months until the standard's review falls due. */
    reviewMonths: z.number().int().min(1).max(60).default(12),
  }),
  z.object({
    decision: z.literal('returned'),
    reason: z.string().trim().min(10, 'Give the reason for returning it (at least 10 characters)').max(4000),
    comment: z.string().trim().max(4000).default(''),
  }),
]);
export type DecideRequest = z.input<typeof decideSchema>;

// ---- standards -------------------------------------------------------------------------------

export const STANDARD_STATUSES = ['active', 'retired', 'superseded'] as const;

export const standardSchema = z.object({
  id: z.string(),
  labId: z.string(),
  recipe: z.object({ id: z.string(), version: z.number().int(), name: z.string() }),
  scope: scopeSchema,
  purpose: z.string(),
  effectiveAt: millis,
  reviewDueAt: millis,
  status: z.enum(STANDARD_STATUSES),
  supersedes: z.object({ id: z.string(), recipeVersion: z.number().int() }).nullable(),
  supersededBy: z.object({ id: z.string(), recipeVersion: z.number().int() }).nullable(),
  ended: z.object({ at: millis, by: person.nullable(), reason: z.string() }).nullable(),
  signature: signatureSchema,
  submissionId: z.string(),
  evidenceStudyIds: z.array(z.string()),
  /** The approved recipe version's settings as labelled rows. */
  settings: settingsSummarySchema.nullable().default(null),
});
export type Standard = z.infer<typeof standardSchema>;

const optionalNumber = z.coerce.number().optional();
export const standardListQuerySchema = z.object({
  ...paging,
  /** Part of the structure type, case-insensitive. */
  structureType: z.string().trim().max(120).optional().transform((v) => v || undefined),
  /** The band the structure needs: a standard covers it when its band contains it. */
  lowHz: optionalNumber,
  highHz: optionalNumber,
  /** The structure's damping, %: a standard covers it when its damping range contains it. */
  dampingPercent: optionalNumber,
  excitation: excitationKindSchema.optional(),
  /** Default: active standards only; 'all' lists every one. */
  status: z.enum([...STANDARD_STATUSES, 'all']).default('active'),
  /** Review due before this time (ms). */
  dueBefore: z.coerce.number().int().optional(),
});
export type StandardListQuery = z.infer<typeof standardListQuerySchema>;
export const standardListSchema = pageOf(standardSchema);

const RETIRE_REASON = 'Give the reason for retiring it (at least 10 characters)';
export const retireSchema = z.object({
  reason: z.string({ error: RETIRE_REASON }).trim().min(10, RETIRE_REASON).max(2000, 'Keep the reason under 2000 characters'),
});

// ---- reports ---------------------------------------------------------------------------------

/** One revision of a controlled report: its number, hash, when it was made and what changed. */
export const reportRevisionSchema = z.object({
  revision: z.number().int().min(1),
  /** The revision's own id (the report's id names the report across its revisions). */
  revisionId: z.string(),
  sha256: z.string(),
  createdAt: millis,
  createdBy: person.nullable(),
  /** What changed from the revision before, in words (empty for revision 1). */
  changes: z.array(z.string()),
});
export type ReportRevision = z.infer<typeof reportRevisionSchema>;

/**
 * A controlled report: one per study or standard, the same id across its revisions. The fields
 * below `id` describe the revision shown (the newest, unless a revision id was asked for).
 */
export const reportRecordSchema = z.object({
  id: z.string(),
  labId: z.string(),
  kind: z.enum(['study', 'standard']),
  targetId: z.string(),
  /** sha256 (hex) of the canonical JSON of `content`. */
  sha256: z.string(),
  createdAt: millis,
  createdBy: person.nullable(),
  revision: z.number().int().min(1).default(1),
  revisionId: z.string().default(''),
  changes: z.array(z.string()).default([]),
  /** Every revision of the report, oldest first. */
  revisions: z.array(reportRevisionSchema).default([]),
});
export type ReportRecord = z.infer<typeof reportRecordSchema>;

const series = z.array(z.number().nullable());
export const reportPlotSchema = z.object({
  scenario: z.string(),
  /** Every `stride`-th band line is drawn; the criteria tables use every line. */
  stride: z.number().int(),
  unit: z.string(),
  frequenciesHz: series,
  exactMagnitude: series,
  estimatedMagnitude: series,
  estimatedMagnitudeP5: series,
  estimatedMagnitudeP95: series,
  meanCoherence: series,
  p5Coherence: series,
  meanMagnitudeErrorDb: series,
  p95AbsMagnitudeErrorDb: series,
  toleranceDb: z.number().nullable(),
  p5MagnitudeErrorDb: series,
  p95MagnitudeErrorDb: series,
  observedRandomError: series,
  predictedRandomError: series,
  note: z.string(),
});
export type ReportPlot = z.infer<typeof reportPlotSchema>;

export const reportCriterionSchema = z.object({
  label: z.string(),
  limit: z.number(),
  observed: z.number().nullable(),
  unit: z.string(),
  pass: z.boolean(),
  /** "PASS", "FAIL" or "CONDITIONAL" (rules with a conditional zone), so the result never rests on colour alone. */
  verdict: z.enum(['PASS', 'FAIL', 'CONDITIONAL']),
  worstLineHz: z.number().nullable(),
  /** The decision rule in words (absent for studies made before decision rules). */
  rule: z.string().optional(),
  /** Expanded Monte Carlo uncertainty U (k = 2) of the observed figure, guard band w, acceptance limit. */
  expandedUncertainty: z.number().nullable().optional(),
  guardBand: z.number().nullable().optional(),
  acceptanceLimit: z.number().nullable().optional(),
  /** From the bootstrap replicates of the figure: P(false accept) for a pass, P(false reject) for a fail. */
  falseAcceptProbability: z.number().nullable().optional(),
  falseRejectProbability: z.number().nullable().optional(),
});

export const reportContentSchema = z.object({
  kind: z.enum(['study', 'standard']),
  title: z.string(),
  lab: z.object({ id: z.string(), name: z.string(), footer: z.string() }),
  purpose: z.string(),
  scope: scopeSchema.nullable(),
  recipe: z.object({ id: z.string(), version: z.number().int(), name: z.string(), state: recipeStateSchema, author: person, definition: z.record(z.string(), z.unknown()) }),
  studies: z.array(
    z.object({
      id: z.string(),
      name: z.string(),
      status: z.string(),
      engineVersion: z.string(),
      seedsPerScenario: z.number().int(),
      baseSeed: z.number().int(),
      seedRule: z.string(),
      runBy: person,
      startedAt: millis.nullable(),
      finishedAt: millis.nullable(),
      pass: z.boolean().nullable(),
      scenarios: z.array(
        z.object({
          id: z.string(),
          version: z.number().int(),
          name: z.string(),
          system: z.string(),
          acquisition: z.string(),
          excitation: z.string(),
          errorSources: z.array(z.string()),
          seeds: z.string(),
          pass: z.boolean(),
          verdict: z.enum(['PASS', 'FAIL']),
          reference: z.string().nullable(),
          criteria: z.array(reportCriterionSchema),
          /** Statement of conformity: the rule, the specification and the results it covers. */
          conformity: z.string().optional(),
          figures: z.record(z.string(), z.number().nullable()),
          warnings: z.array(z.string()),
          plot: reportPlotSchema.nullable(),
        }),
      ),
    }),
  ),
  /** The recipe version's processing settings and acceptance criteria as labelled rows. */
  settings: settingsSummarySchema,
  justification: z.string().nullable(),
  signature: signatureSchema.nullable(),
  standard: z
    .object({ id: z.string(), status: z.string(), effectiveAt: millis, reviewDueAt: millis, supersedes: z.string().nullable(), supersededBy: z.string().nullable() })
    .nullable(),
  /** For a standard: whether the stored evidence still hashes to the signed value. */
  evidenceCheck: z.object({ recomputedSha256: z.string(), matchesSignature: z.boolean() }).nullable(),
  engineVersion: z.string(),
  reproducibility: z.string(),
  cautions: z.array(z.string()),
});
export type ReportContent = z.infer<typeof reportContentSchema>;

/**
 * The lab's audit trail when the report was made: its newest checkpoint outside the database. Kept
 * beside the content, not in it, so the content's sha256 stays the same when the trail grows.
 */
export const reportTrailSchema = z.object({ events: z.number().int(), head: z.string(), checkpointAt: millis });
export type ReportTrail = z.infer<typeof reportTrailSchema>;

/** The report's line about the trail: "audit trail: N events, head <hash>, checkpoint <time>". */
export function auditTrailLine(trail: ReportTrail | null): string {
  if (!trail) return 'audit trail: no checkpoint recorded yet';
  const at = new Date(trail.checkpointAt).toISOString().slice(0, 19).replace('T', ' ');
  return `audit trail: ${trail.events} events, head ${trail.head}, checkpoint ${at} UTC`;
}

export const reportSchema = z.object({ report: reportRecordSchema, content: reportContentSchema, trail: reportTrailSchema.nullable().default(null) });
export type Report = z.infer<typeof reportSchema>;

// ---- re-verification -------------------------------------------------------------------------

export const REVERIFY_TOLERANCE = 1e-12;
export const lineVerdictSchema = z.enum(['identical', 'within-tolerance', 'changed']);

export const reverifySchema = z.object({
  standardId: z.string(),
  engineVersion: z.string(),
  storedEngineVersions: z.array(z.string()),
  /** identical: every number bit for bit; within-tolerance: |Δ| ≤ 1e-12·max(1, |stored|); else changed. */
  verdict: lineVerdictSchema,
  tolerance: z.number(),
  runs: z.number().int(),
  /** The largest difference seen (null difference: one side is not a finite number). */
  largestChange: z
    .object({
      studyId: z.string(),
      scenario: z.string(),
      quantity: z.string(),
      frequencyHz: z.number().nullable(),
      stored: z.union([z.number(), z.string(), z.boolean()]).nullable(),
      recomputed: z.union([z.number(), z.string(), z.boolean()]).nullable(),
      difference: z.number().nullable(),
    })
    .nullable(),
  /** One line per study × scenario × stored quantity (each result curve, the criteria, the modes, the figures). */
  lines: z.array(
    z.object({
      studyId: z.string(),
      scenario: z.string(),
      quantity: z.string(),
      values: z.number().int(),
      verdict: lineVerdictSchema,
      /** Largest |difference| on the line; null when a value is not comparable (e.g. NaN against a number). */
      maxDifference: z.number().nullable(),
      atHz: z.number().nullable(),
      error: z.string().nullable(),
    }),
  ),
  at: millis,
});
export type Reverification = z.infer<typeof reverifySchema>;
