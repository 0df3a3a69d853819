/**
 * Use cases of uploads. A time-data file is run through one of the lab's recipes; an FRF file is
 * scored against a scenario's exact FRF. The file is checked and analysed completely before
 * anything is stored; then its row, its audit event and the move of the file into place happen in
 * one transaction. A rejected file leaves nothing behind (its incoming copy is removed).
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Upload, UploadFields } from '@/shared/api/work';
import { uploadFieldsSchema } from '@/shared/api/work';
import { parseRecipe, type Recipe } from '@/shared/engine/recipe';
import type { Db } from '../db/knex';
import { findUpload, insertUpload, listUploads, type UploadRow } from '../db/uploads';
import { findResource, findVersion, type VersionedKind } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { recordAudit } from './audit';
import { badFile, readNumericTable } from './csv-read';
import { checkedByEngine } from './engine-input';
import { analyseUploadedFrf } from './frf-upload-analysis';
import { scenarioSystem } from './scenario-definition';
import { analyseTimeData } from './time-data-analysis';
import { discard, generatedName, moveIntoPlace, sha256Hex, uploadsDir } from './upload-files';

export const MAX_UPLOAD_BYTES = 32 * 1024 * 1024;
const MAX_ROWS = 2_000_000;

export interface IncomingFile {
  path: string;
  originalName: string;
  size: number;
}

export function uploadView(r: UploadRow): Upload {
  return {
    id: r.id,
    labId: r.lab_id,
    kind: r.kind,
    originalName: r.original_name,
    sizeBytes: r.size_bytes,
    sha256: r.sha256,
    recipe: r.recipe_id ? { id: r.recipe_id, version: r.recipe_version! } : null,
    scenario: r.scenario_id ? { id: r.scenario_id, version: r.scenario_version! } : null,
    summary: JSON.parse(r.summary),
    createdBy: { id: r.created_by, displayName: r.created_by_name },
    createdAt: Number(r.created_at),
  };
}

async function definitionOf(db: Db, kind: VersionedKind, noun: string, labId: string, id: string, version?: number) {
  const head = await findResource(db, kind, labId, id);
  if (!head) throw notFound(`${noun} ${id}`);
  const v = await findVersion(db, kind, id, version ?? head.latest_version);
  if (!v) throw notFound(`Version ${version} of ${noun.toLowerCase()} ${id}`);
  return { version: v.version, definition: JSON.parse(v.body) as unknown };
}

function readText(bytes: Buffer): string {
  const text = bytes.toString('utf8');
  if (text.includes('\uFFFD')) throw badFile('the file is not UTF-8 text');
  return text;
}

/** Analyses a file for the given fields: the result, and what the row keeps about it. */
async function analyse(db: Db, labId: string, fields: UploadFields, bytes: Buffer) {
  const table = readNumericTable(readText(bytes), { minRows: fields.kind === 'frf' ? 1 : 8, maxRows: MAX_ROWS });
  if (fields.kind === 'time-data') {
    const recipe = await definitionOf(db, 'recipes', 'Recipe', labId, fields.recipeId, fields.recipeVersion);
    const parsed: Recipe = checkedByEngine('recipe', () => parseRecipe(recipe.definition));
    const result = analyseTimeData(table, parsed, fields);
    const ref = { recipe_id: fields.recipeId, recipe_version: recipe.version, scenario_id: null, scenario_version: null };
    const summary = {
      columns: { input: fields.inputColumn, output: fields.outputColumn, time: fields.sampleRateHz ? null : fields.timeColumn },
      sampleRateHz: result.sampleRateHz,
      samples: result.samples,
      blockLength: result.blockLength,
      averages: result.averages,
      lines: result.frequenciesHz.length,
      warnings: result.warnings,
    };
    return { result, ref, summary };
  }
  const scenario = await definitionOf(db, 'scenarios', 'Scenario', labId, fields.scenarioId, fields.scenarioVersion);
  const result = analyseUploadedFrf(table, scenarioSystem(scenario.definition));
  const ref = { recipe_id: null, recipe_version: null, scenario_id: fields.scenarioId, scenario_version: scenario.version };
  return { result, ref, summary: { format: result.format, unit: result.unit, ...result.summary } };
}

export async function storeUpload(
  db: Db,
  dataDir: string,
  labId: string,
  userId: string,
  rawFields: unknown,
  file: IncomingFile | undefined,
) {
  try {
    if (!file) throw new AppError(400, 'invalid_request', 'file: attach the CSV file in the form field "file"', { fields: [{ path: 'file', message: 'attach the CSV file in the form field "file"' }] });
    const fields = uploadFieldsFrom(rawFields);
    const bytes = fs.readFileSync(file.path);
    const { result, ref, summary } = await analyse(db, labId, fields, bytes);
    const id = randomUUID();
    const storedName = generatedName('.csv');
    const sha256 = sha256Hex(bytes);
    let placed: string | undefined;
    try {
      await db.transaction(async (trx) => {
      await insertUpload(trx, {
        id,
        lab_id: labId,
        kind: fields.kind,
        original_name: path.basename(file.originalName || 'upload.csv').slice(0, 200),
        stored_name: storedName,
        size_bytes: bytes.length,
        sha256,
        ...ref,
        summary: JSON.stringify(summary),
        status: 'stored',
        created_by: userId,
        created_at: Date.now(),
      });
      await recordAudit(trx, { labId, actorUserId: userId, action: 'uploads.create', targetType: 'upload', targetId: id, after: { kind: fields.kind, originalName: file.originalName, sha256 } });
      placed = moveIntoPlace(file.path, dataDir, storedName);
    });
    } catch (err) {
      // The commit itself failed after the move: take the file back out, so no file lacks a row.
      discard(placed);
      throw err;
    }
    const row = await findUpload(db, labId, id);
    return { upload: uploadView(row!), result };
  } finally {
    // After a successful move the incoming path no longer exists; otherwise this removes it.
    discard(file?.path);
  }
}

function uploadFieldsFrom(raw: unknown): UploadFields {
  const parsed = uploadFieldsSchema.safeParse(raw ?? {});
  if (parsed.success) return parsed.data;
  const fields = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
  throw new AppError(400, 'invalid_request', `${fields[0].path || 'kind'}: ${fields[0].message}`, { fields });
}

export async function listLabUploads(db: Db, labId: string, query: Parameters<typeof listUploads>[2]) {
  const { rows, total } = await listUploads(db, labId, query);
  return { items: rows.map(uploadView), total, limit: query.limit, offset: query.offset };
}

export async function getUpload(db: Db, labId: string, id: string): Promise<Upload> {
  const row = await findUpload(db, labId, id);
  if (!row) throw notFound(`Upload ${id}`);
  return uploadView(row);
}

/** The result of a stored upload, recomputed from its file and the versions it was made with. */
export async function getUploadResult(db: Db, dataDir: string, labId: string, id: string) {
  const row = await findUpload(db, labId, id);
  if (!row) throw notFound(`Upload ${id}`);
  const bytes = fs.readFileSync(path.join(uploadsDir(dataDir), row.stored_name));
  const summary = JSON.parse(row.summary) as { columns?: { input: string; output: string; time: string | null }; sampleRateHz?: number };
  const fields: UploadFields =
    row.kind === 'time-data'
      ? {
          kind: 'time-data',
          recipeId: row.recipe_id!,
          recipeVersion: row.recipe_version!,
          inputColumn: summary.columns!.input,
          outputColumn: summary.columns!.output,
          timeColumn: summary.columns!.time ?? 'time_s',
          sampleRateHz: summary.columns!.time ? undefined : summary.sampleRateHz,
        }
      : { kind: 'frf', scenarioId: row.scenario_id!, scenarioVersion: row.scenario_version! };
  const { result } = await analyse(db, labId, fields, bytes);
  return { upload: uploadView(row), result };
}
