/**
 * Validation reports: JSON for the printable page and a PDF made on the server, for a study and
 * for an approved standard; and the registry entry of a report by its id.
 */
import { Router, type Response } from 'express';
import { z } from 'zod';
import { reportRecordSchema, reportSchema } from '@/shared/api/approval';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { getReportRecord, makeReport, makeReportPdf, type ReportKind } from '../services/reports';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });

export function reportRoutes(deps: Pick<AppDeps, 'db'>): Router {
  const r = Router();
  const { db } = deps;
  const sendPdf = async (res: Response, labId: string, userId: string, kind: ReportKind, id: string) => {
    const { report, pdf } = await makeReportPdf(db, labId, userId, kind, id);
    res.set({ 'X-Report-Id': report.id, 'X-Report-Sha256': report.sha256 });
    res.type('application/pdf').attachment(`plumbline-${kind}-report-${report.id}.pdf`).send(pdf);
  };
  // The .pdf routes come first: ':id' alone would also match "x.pdf".
  labRoute(r, db, { method: 'get', path: '/labs/:labId/reports/study/:id.pdf', action: 'reports.read', summary: "A study's validation report as PDF", produces: 'application/pdf' }, async (req, res) => {
    await sendPdf(res, req.lab.id, req.user.id, 'study', parseBody(idParam, req.params).id);
  });
  labRoute(r, db, { method: 'get', path: '/labs/:labId/reports/study/:id', action: 'reports.read', summary: "A study's validation report (content for the printable page)", response: reportSchema }, async (req, res) => {
    res.json(await makeReport(db, req.lab.id, req.user.id, 'study', parseBody(idParam, req.params).id));
  });
  labRoute(r, db, { method: 'get', path: '/labs/:labId/standards/:id/report.pdf', action: 'reports.read', summary: "A standard's validation report as PDF", produces: 'application/pdf' }, async (req, res) => {
    await sendPdf(res, req.lab.id, req.user.id, 'standard', parseBody(idParam, req.params).id);
  });
  labRoute(r, db, { method: 'get', path: '/labs/:labId/standards/:id/report', action: 'reports.read', summary: "A standard's validation report (content for the printable page)", response: reportSchema }, async (req, res) => {
    res.json(await makeReport(db, req.lab.id, req.user.id, 'standard', parseBody(idParam, req.params).id));
  });
  labRoute(r, db, { method: 'get', path: '/labs/:labId/reports/:id', action: 'reports.read', summary: 'A registered report by id: its kind, target, sha256 and creation', response: reportRecordSchema }, async (req, res) => {
    res.json(await getReportRecord(db, req.lab.id, parseBody(idParam, req.params).id));
  });
  return r;
}
