/**
 * CSV exports: a scenario's simulated signals for one seed (so a lab can run the same samples
 * through its own acquisition software), its exact FRF, and a study's results and criteria.
 * Cells are escaped against formula injection by csv-format.ts; numbers are written exactly.
 *
 * Signals: time_s (n / fs, s), input (force, N), output (response in m, m/s or m/s² for
 * receptance, mobility or accelerance). Exact FRF: frequency_hz, h_re, h_im in m/N, m/(N·s) or
 * m/(N·s²), the underlying linear system's FRF.
 */
import { parseScenario, resolveScenario, simulateScenario } from '@/shared/engine/scenario';
import type { Db } from '../db/knex';
import { findResource, findVersion } from '../db/versioned';
import { AppError, notFound } from '../errors';
import type { CsvCell } from './csv-format';
import { checkedByEngine } from './engine-input';
import { getStudyResults } from './study-results';
import { encodeFloatWav, type WavFile } from './wav';

export interface CsvExport {
  filename: string;
  header: string[];
  rows: Iterable<CsvCell[]>;
  /** Facts a reader needs (units, sample rate), sent as response headers. */
  facts: Record<string, string>;
}

const MAX_EXACT_LINES = 4_000_000;

async function scenarioDefinition(db: Db, labId: string, id: string, version?: number) {
  const head = await findResource(db, 'scenarios', labId, id);
  if (!head) throw notFound(`Scenario ${id}`);
  const v = await findVersion(db, 'scenarios', id, version ?? head.latest_version);
  if (!v) throw notFound(`Version ${version} of scenario ${id}`);
  return { name: head.name, version: v.version, definition: JSON.parse(v.body) as unknown };
}

/** A file name from a resource name: letters, digits and dashes only. */
export function fileSafe(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'export';
}

export async function scenarioSignals(db: Db, labId: string, id: string, q: { seed: number; version?: number }): Promise<CsvExport> {
  const s = await scenarioDefinition(db, labId, id, q.version);
  const record = checkedByEngine('scenario', () => simulateScenario(parseScenario(s.definition), q.seed));
  const fs = record.sampleRateHz;
  function* rows() {
    for (let i = 0; i < record.input.length; i++) yield [i / fs, record.input[i], record.output[i]];
  }
  return {
    filename: `${fileSafe(s.name)}-v${s.version}-seed-${q.seed}-signals.csv`,
    header: ['time_s', 'input', 'output'],
    rows: rows(),
    facts: {
      'X-Sample-Rate-Hz': String(fs),
      'X-Input-Unit': record.inputUnit,
      'X-Output-Unit': encodeURIComponent(record.outputUnit),
      'X-Samples': String(record.input.length),
    },
  };
}

/** The same signals as scenarioSignals, as a two-channel 32-bit float WAV (see wav.ts). */
export async function scenarioSignalsWav(
  db: Db,
  labId: string,
  id: string,
  q: { seed: number; version?: number },
): Promise<WavFile & { filename: string }> {
  const s = await scenarioDefinition(db, labId, id, q.version);
  const record = checkedByEngine('scenario', () => simulateScenario(parseScenario(s.definition), q.seed));
  const wav = encodeFloatWav(record.sampleRateHz, [
    { name: 'input (force)', unit: record.inputUnit, samples: record.input },
    { name: 'output (response)', unit: record.outputUnit, samples: record.output },
  ]);
  return { ...wav, filename: `${fileSafe(s.name)}-v${s.version}-seed-${q.seed}-signals.wav` };
}

export async function scenarioExact(db: Db, labId: string, id: string, q: { df?: number; version?: number }): Promise<CsvExport> {
  const s = await scenarioDefinition(db, labId, id, q.version);
  const { plan } = checkedByEngine('scenario', () => resolveScenario(s.definition));
  const fs = plan.sampleRateHz;
  const df = q.df ?? fs / plan.recordSamples;
  const count = Math.floor(fs / 2 / df + 1e-9) + 1;
  if (count > MAX_EXACT_LINES) {
    throw new AppError(400, 'invalid_request', `df: ${df} Hz gives ${count} lines up to fs/2; use a coarser spacing`, { fields: [{ path: 'df', message: 'too fine' }] });
  }
  const grid = new Float64Array(count);
  for (let k = 0; k < count; k++) grid[k] = k * df;
  const h = plan.system.frf(grid);
  function* rows() {
    for (let k = 0; k < count; k++) yield [grid[k], h.re[k], h.im[k]];
  }
  return {
    filename: `${fileSafe(s.name)}-v${s.version}-exact-frf.csv`,
    header: ['frequency_hz', 'h_re', 'h_im'],
    rows: rows(),
    facts: { 'X-Frf-Quantity': plan.system.quantity, 'X-Frf-Unit': encodeURIComponent(plan.system.unit), 'X-Line-Spacing-Hz': String(df) },
  };
}

/** The per-line curves written to results.csv, in this order (the engine's aggregate names). */
export const RESULT_COLUMNS = [
  'meanMagnitudeDb',
  'stdMagnitudeDb',
  'p5MagnitudeDb',
  'p50MagnitudeDb',
  'p95MagnitudeDb',
  'p95AbsMagnitudeDb',
  'meanPhaseDeg',
  'stdPhaseDeg',
  'p95AbsPhaseDeg',
  'meanComplexRelative',
  'p95ComplexRelative',
  'meanCoherence',
  'p5Coherence',
  'observedRandomError',
  'predictedRandomError',
  'randomErrorRatio',
  'coverage',
  'phaseCoverage',
] as const;

const snake = (name: string) => name.replace(/[A-Z]/g, (m) => `_${m.toLowerCase()}`);

export async function studyResultsCsv(db: Db, labId: string, id: string): Promise<CsvExport> {
  const results = await getStudyResults(db, labId, id);
  function* rows() {
    for (const s of results.scenarios) {
      const f = s.curves.frequenciesHz ?? [];
      for (let i = 0; i < f.length; i++) {
        yield [s.name, s.scenarioId, s.scenarioVersion, f[i], ...RESULT_COLUMNS.map((c) => s.curves[c]?.[i] ?? null)];
      }
    }
  }
  return {
    filename: `study-${id.slice(0, 8)}-results.csv`,
    header: ['scenario', 'scenario_id', 'scenario_version', 'frequency_hz', ...RESULT_COLUMNS.map(snake)],
    rows: rows(),
    facts: { 'X-Engine-Version': results.engineVersion },
  };
}

export async function studyCriteriaCsv(db: Db, labId: string, id: string): Promise<CsvExport> {
  const results = await getStudyResults(db, labId, id);
  function* rows() {
    for (const s of results.scenarios) {
      for (const c of s.criteria) yield [s.name, c.id, c.label, c.limit, c.observed, c.unit, c.pass ? 'pass' : 'fail', c.worstLineHz, c.note ?? ''];
    }
  }
  return {
    filename: `study-${id.slice(0, 8)}-criteria.csv`,
    header: ['scenario', 'criterion', 'label', 'limit', 'observed', 'unit', 'verdict', 'worst_line_hz', 'note'],
    rows: rows(),
    facts: { 'X-Engine-Version': results.engineVersion },
  };
}
