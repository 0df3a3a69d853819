/**
 * CSV exports under /labs/:labId: a scenario's signals for one seed and its exact FRF, a study's
 * per-line results and its criteria. Rows are streamed in chunks, so a long record is never one
 * string in memory.
 */
import { Router, type Response } from 'express';
import { z } from 'zod';
import { exactExportQuerySchema, signalsExportQuerySchema } from '@/shared/api/work';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { formatCsvCell } from '../services/csv-format';
import { scenarioExact, scenarioSignals, scenarioSignalsWav, studyCriteriaCsv, studyResultsCsv, type CsvExport } from '../services/exports';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });
const ROWS_PER_CHUNK = 5000;

async function sendCsv(res: Response, file: CsvExport) {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
  res.setHeader('Cache-Control', 'no-store');
  for (const [k, v] of Object.entries(file.facts)) res.setHeader(k, v);
  let chunk: string[] = [file.header.map(formatCsvCell).join(',')];
  for (const row of file.rows) {
    chunk.push(row.map(formatCsvCell).join(','));
    if (chunk.length >= ROWS_PER_CHUNK) {
      if (!res.write(chunk.join('\r\n') + '\r\n')) await new Promise((resolve) => res.once('drain', resolve));
      chunk = [];
    }
  }
  res.end(chunk.length ? chunk.join('\r\n') + '\r\n' : undefined);
}

export function exportRoutes(deps: AppDeps): Router {
  const r = Router();
  const lab = '/labs/:labId';
  labRoute(r, deps.db, { method: 'get', path: `${lab}/scenarios/:id/signals.csv`, action: 'exports.read', summary: "A scenario's force and response signals for one seed (CSV)", query: signalsExportQuerySchema, produces: 'text/csv' }, async (req, res) => {
    await sendCsv(res, await scenarioSignals(deps.db, req.lab.id, parseBody(idParam, req.params).id, parseBody(signalsExportQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${lab}/scenarios/:id/signals.wav`, action: 'exports.read', summary: "A scenario's force and response signals for one seed (2-channel 32-bit float WAV; each channel scaled by its peak, scales in the X-Channel-Scales header and the file's comment)", query: signalsExportQuerySchema, produces: 'audio/wav' }, async (req, res) => {
    const wav = await scenarioSignalsWav(deps.db, req.lab.id, parseBody(idParam, req.params).id, parseBody(signalsExportQuerySchema, req.query));
    res.setHeader('Content-Type', 'audio/wav');
    res.setHeader('Content-Disposition', `attachment; filename="${wav.filename}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('X-Channel-Scales', wav.scales.map((v) => v.toPrecision(17)).join(','));
    res.setHeader('X-Wav-Comment', encodeURIComponent(wav.comment));
    res.end(wav.bytes);
  });
  labRoute(r, deps.db, { method: 'get', path: `${lab}/scenarios/:id/exact.csv`, action: 'exports.read', summary: "A scenario's exact FRF (CSV)", query: exactExportQuerySchema, produces: 'text/csv' }, async (req, res) => {
    await sendCsv(res, await scenarioExact(deps.db, req.lab.id, parseBody(idParam, req.params).id, parseBody(exactExportQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${lab}/studies/:id/results.csv`, action: 'exports.read', summary: "A study's per-line results over seeds (CSV)", produces: 'text/csv' }, async (req, res) => {
    await sendCsv(res, await studyResultsCsv(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${lab}/studies/:id/criteria.csv`, action: 'exports.read', summary: "A study's criteria and verdicts (CSV)", produces: 'text/csv' }, async (req, res) => {
    await sendCsv(res, await studyCriteriaCsv(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  return r;
}
