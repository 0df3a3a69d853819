/**
 * Request and response schemas of the work side of the API: versioned systems, scenarios and
 * recipes; studies with their runs, results and progress events; uploads; exports.
 * Times are milliseconds since the Unix epoch (UTC). Lists take ?limit&offset&sort&order&q and
 * answer { items, total, limit, offset }. Numbers that have no value (an undefined score at a line
 * whose exact FRF is zero) travel as null.
 */
import { z } from 'zod';
import { recipeSchema } from '@/shared/engine/recipe';
import { scenarioSchema } from '@/shared/engine/scenario';
import { systemSpecSchema } from '@/shared/engine/systems/schema';

const millis = z.number().int();
const id = z.string().min(1).max(100);
const person = z.object({ id: z.string(), displayName: z.string() });

/** A page of a list: the items, the count of all that match, and the page asked for. */
export const workPageOf = <T extends z.ZodType>(item: T) =>
  z.object({ items: z.array(item), total: z.number().int(), limit: z.number().int(), offset: z.number().int() });

/** List query of a lab list: paging, one whitelisted sort key, order, and a name filter. */
export const listQueryOf = <S extends readonly [string, ...string[]]>(sorts: S, defaultSort: S[number], defaultOrder: 'asc' | 'desc') =>
  z.object({
    limit: z.coerce.number().int().min(1).max(200).default(50),
    offset: z.coerce.number().int().min(0).default(0),
    // parse() gives the default the enum's own output type (and checks it is one of the sorts).
    sort: z.enum(sorts).default(z.enum(sorts).parse(defaultSort)),
    order: z.enum(['asc', 'desc']).default(defaultOrder),
    /** Part of the name, case-insensitive; empty means no filter. */
    q: z
      .string()
      .trim()
      .max(100)
      .optional()
      .transform((v) => (v ? v : undefined)),
  });

// ---- versioned resources (systems, scenarios, recipes) ---------------------------------------

export const RESOURCE_SORTS = ['name', 'createdAt', 'updatedAt'] as const;
export const resourceListQuerySchema = listQueryOf(RESOURCE_SORTS, 'updatedAt', 'desc');
export type ResourceListQuery = z.infer<typeof resourceListQuerySchema>;

const name = z.string().trim().min(1, 'Give a name').max(200);
const description = z.string().max(2000);
const note = z.string().trim().max(500);

/**
 * Create body: the definition (validated by the engine's schema), a name (taken from the
 * definition's own `name` when it has one and none is given here), a description, and a note that
 * explains the version.
 */
export const createBodyOf = <D extends z.ZodType>(definition: D) =>
  z.object({ name: name.optional(), description: description.optional(), note: note.optional(), definition });

/** Update body: as create, plus the version the edit starts from (409 if another came first). */
export const updateBodyOf = <D extends z.ZodType>(definition: D) =>
  createBodyOf(definition).extend({ baseVersion: z.number().int().min(1) });

export const resourceSummarySchema = z.object({
  id: z.string(),
  labId: z.string(),
  name: z.string(),
  description: z.string(),
  latestVersion: z.number().int(),
  createdBy: person,
  updatedBy: person,
  createdAt: millis,
  updatedAt: millis,
});
export type ResourceSummary = z.infer<typeof resourceSummarySchema>;
export const resourceListSchema = workPageOf(resourceSummarySchema);
export type ResourceList = z.infer<typeof resourceListSchema>;

export const versionInfoSchema = z.object({
  version: z.number().int(),
  name: z.string(),
  note: z.string(),
  author: person,
  createdAt: millis,
});
export type VersionInfo = z.infer<typeof versionInfoSchema>;
export const versionListSchema = z.object({ items: z.array(versionInfoSchema) });

/** One version of a resource with its definition (GET latest or GET /versions/:n). */
export const resourceVersionOf = <D extends z.ZodType>(definition: D) =>
  resourceSummarySchema.extend({ version: versionInfoSchema, definition });

export const systemCreateSchema = createBodyOf(systemSpecSchema);
export const systemUpdateSchema = updateBodyOf(systemSpecSchema);
export const systemVersionSchema = resourceVersionOf(systemSpecSchema);
export const scenarioCreateSchema = createBodyOf(scenarioSchema);
export const scenarioUpdateSchema = updateBodyOf(scenarioSchema);
export const scenarioVersionSchema = resourceVersionOf(scenarioSchema);
export const recipeCreateSchema = createBodyOf(recipeSchema);
export const recipeUpdateSchema = updateBodyOf(recipeSchema);
export const recipeVersionSchema = resourceVersionOf(recipeSchema);
export type SystemVersion = z.infer<typeof systemVersionSchema>;
export type ScenarioVersion = z.infer<typeof scenarioVersionSchema>;
export type RecipeVersion = z.infer<typeof recipeVersionSchema>;

export const versionParamSchema = z.object({ version: z.coerce.number().int().min(1) });

// ---- studies ---------------------------------------------------------------------------------

export const studyStatusSchema = z.enum(['queued', 'running', 'finished', 'failed', 'cancelled']);
export type StudyStatus = z.infer<typeof studyStatusSchema>;

export const MAX_STUDY_RUNS = 5000;

export const startStudySchema = z
  .object({
    name,
    recipe: z.object({ id, version: z.number().int().min(1).optional() }),
    /** Scenarios in the order results show them; each at most once; latest version if not given. */
    scenarios: z.array(z.object({ id, version: z.number().int().min(1).optional() })).min(1).max(50),
    /** Monte Carlo seeds per scenario. */
    seeds: z.number().int().min(1).max(1000),
    /** The engine's seed rule: run r of the scenario at position j uses baseSeed + j·1000000 + r. */
    baseSeed: z.number().int().min(0).max(2 ** 40).default(1),
  })
  .refine((s) => new Set(s.scenarios.map((x) => x.id)).size === s.scenarios.length, {
    path: ['scenarios'],
    message: 'Each scenario may appear only once',
  })
  .refine((s) => s.scenarios.length * s.seeds <= MAX_STUDY_RUNS, {
    path: ['seeds'],
    message: `A study may hold at most ${MAX_STUDY_RUNS} runs (scenarios × seeds)`,
  });
export type StartStudyRequest = z.input<typeof startStudySchema>;

export const STUDY_SORTS = ['name', 'createdAt', 'status', 'finishedAt'] as const;
export const studyListQuerySchema = listQueryOf(STUDY_SORTS, 'createdAt', 'desc').extend({ status: studyStatusSchema.optional() });
export type StudyListQuery = z.infer<typeof studyListQuerySchema>;

export const studyProgressSchema = z.object({
  status: studyStatusSchema,
  done: z.number().int(),
  failed: z.number().int(),
  total: z.number().int(),
  currentScenario: z.object({ id: z.string(), name: z.string() }).nullable(),
  /** Estimated seconds to the end from the pace so far; null before the first run or when over. */
  etaSeconds: z.number().nullable(),
});
export type StudyProgress = z.infer<typeof studyProgressSchema>;

export const studySchema = z.object({
  id: z.string(),
  labId: z.string(),
  name: z.string(),
  status: studyStatusSchema,
  recipe: z.object({ id: z.string(), version: z.number().int(), name: z.string() }),
  scenarios: z.array(z.object({ id: z.string(), version: z.number().int(), name: z.string(), position: z.number().int() })),
  seeds: z.number().int(),
  baseSeed: z.number().int(),
  progress: studyProgressSchema,
  engineVersion: z.string(),
  /** All criteria of every scenario passed; null until the study has finished. */
  pass: z.boolean().nullable(),
  error: z.string().nullable(),
  createdBy: person,
  createdAt: millis,
  startedAt: millis.nullable(),
  finishedAt: millis.nullable(),
});
export type Study = z.infer<typeof studySchema>;
export const studyListSchema = workPageOf(studySchema.omit({ scenarios: true }));
export type StudyList = z.infer<typeof studyListSchema>;

export const runSchema = z.object({
  id: z.number().int(),
  scenarioId: z.string(),
  scenarioVersion: z.number().int(),
  position: z.number().int(),
  seedIndex: z.number().int(),
  seed: z.number().int(),
  status: z.enum(['finished', 'failed']),
  /** The run's band figures (maximum |errors| in the band, worst lines, modal errors). */
  summary: z.record(z.string(), z.unknown()).nullable(),
  error: z.string().nullable(),
  startedAt: millis,
  finishedAt: millis,
});
export type Run = z.infer<typeof runSchema>;
export const runListSchema = z.object({ items: z.array(runSchema) });

export const criterionSchema = z.object({
  id: z.string(),
  label: z.string(),
  limit: z.number(),
  observed: z.number().nullable(),
  unit: z.string(),
  pass: z.boolean(),
  worstLineHz: z.number().nullable(),
  note: z.string().optional(),
});

const curve = z.array(z.number().nullable());

/** Criteria, band figures, modal aggregates and per-line curves of one comparison. */
const comparisonSchema = z.object({
  pass: z.boolean(),
  criteria: z.array(criterionSchema),
  /** seeds, lines, overallCoverage, overallPhaseCoverage, medianRandomErrorRatio. */
  figures: z.record(z.string(), z.number().nullable()),
  modes: z.array(z.record(z.string(), z.unknown())),
  /** Per-line statistics over seeds, each aligned with curves.frequenciesHz (the engine's names). */
  curves: z.record(z.string(), curve),
});

export const scenarioResultSchema = comparisonSchema.extend({
  scenarioId: z.string(),
  scenarioVersion: z.number().int(),
  name: z.string(),
  /** Seeds that finished and entered the aggregate. */
  seeds: z.number().int(),
  failedRuns: z.number().int(),
  /** What the judged comparison is against: the linear FRF, or it seen through the exponential window. */
  reference: z.string().nullable(),
  referenceNote: z.string().nullable(),
  warnings: z.array(z.object({ message: z.string(), runs: z.number().int() })),
  /** Transient recipes: the comparison against the plain linear FRF, damping corrected. */
  plain: comparisonSchema.nullable(),
});
export type ScenarioResult = z.infer<typeof scenarioResultSchema>;

export const studyResultsSchema = z.object({
  studyId: z.string(),
  status: studyStatusSchema,
  engineVersion: z.string(),
  pass: z.boolean().nullable(),
  error: z.string().nullable(),
  scenarios: z.array(scenarioResultSchema),
});
export type StudyResults = z.infer<typeof studyResultsSchema>;

/** Server-sent events of GET /studies/:id/events: `progress` while it runs, one `end` at the end. */
export const studyEventSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('progress'), progress: studyProgressSchema }),
  z.object({ type: z.literal('end'), progress: studyProgressSchema, error: z.string().nullable() }),
]);
export type StudyEvent = z.infer<typeof studyEventSchema>;

// ---- uploads ---------------------------------------------------------------------------------

export const uploadKindSchema = z.enum(['time-data', 'frf']);
export type UploadKind = z.infer<typeof uploadKindSchema>;

const optionalInt = z.coerce.number().int().min(1).optional();
const columnName = z.string().trim().min(1).max(100);

/** Form fields of a time-data upload (multipart, with the file in field `file`). */
export const timeDataFieldsSchema = z.object({
  kind: z.literal('time-data'),
  recipeId: id,
  recipeVersion: optionalInt,
  inputColumn: columnName.default('input'),
  outputColumn: columnName.default('output'),
  /** Time column, s; the sample rate comes from its step unless sampleRateHz is given. */
  timeColumn: columnName.default('time_s'),
  sampleRateHz: z.coerce.number().positive().optional(),
});

/** Form fields of an FRF upload: columns frequency_hz with h_re, h_im or magnitude_db, phase_deg. */
export const frfFieldsSchema = z.object({
  kind: z.literal('frf'),
  scenarioId: id,
  scenarioVersion: optionalInt,
});

export const uploadFieldsSchema = z.discriminatedUnion('kind', [timeDataFieldsSchema, frfFieldsSchema]);
export type UploadFields = z.infer<typeof uploadFieldsSchema>;

export const uploadSchema = z.object({
  id: z.string(),
  labId: z.string(),
  kind: uploadKindSchema,
  originalName: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  recipe: z.object({ id: z.string(), version: z.number().int() }).nullable(),
  scenario: z.object({ id: z.string(), version: z.number().int() }).nullable(),
  summary: z.record(z.string(), z.unknown()),
  createdBy: person,
  createdAt: millis,
});
export type Upload = z.infer<typeof uploadSchema>;

export const UPLOAD_SORTS = ['createdAt', 'name'] as const;
export const uploadListQuerySchema = listQueryOf(UPLOAD_SORTS, 'createdAt', 'desc').extend({ kind: uploadKindSchema.optional() });
export const uploadListSchema = workPageOf(uploadSchema);

const complexCurve = z.object({ re: curve, im: curve });

/** What a time-data upload gives: the three estimators, coherence and random error on the band. */
export const timeDataResultSchema = z.object({
  kind: z.literal('time-data'),
  sampleRateHz: z.number(),
  samples: z.number().int(),
  blockLength: z.number().int(),
  averages: z.number().int(),
  effectiveAverages: z.number(),
  unit: z.string().nullable(),
  frequenciesHz: curve,
  h1: complexCurve,
  h2: complexCurve,
  hv: complexCurve,
  coherence: curve,
  randomError: z.object({ magnitude: curve, phaseDeg: curve }),
  warnings: z.array(z.string()),
});

/** What an FRF upload gives: its scores against the scenario's exact FRF at the file's lines. */
export const frfResultSchema = z.object({
  kind: z.literal('frf'),
  unit: z.string(),
  frequenciesHz: curve,
  exact: complexCurve,
  uploaded: complexCurve,
  magnitudeErrorDb: curve,
  phaseErrorDeg: curve,
  complexRelativeError: curve,
  summary: z.record(z.string(), z.number().nullable()),
  format: z.enum(['re-im', 'magnitude-phase']),
});

export const uploadResultSchema = z.object({
  upload: uploadSchema,
  result: z.discriminatedUnion('kind', [timeDataResultSchema, frfResultSchema]),
});
export type UploadResult = z.infer<typeof uploadResultSchema>;

// ---- exports ---------------------------------------------------------------------------------

export const signalsExportQuerySchema = z.object({
  seed: z.coerce.number().int().min(0).max(2 ** 31 - 1).default(1),
  version: optionalInt,
});
export const exactExportQuerySchema = z.object({
  /** Line spacing, Hz; default the scenario's fs / record length. */
  df: z.coerce.number().positive().optional(),
  version: optionalInt,
});
