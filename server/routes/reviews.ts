/**
 * /labs/:labId/reviews: submit a recipe version for review, the inbox, a submission, its evidence,
 * and the decision (approve with an electronic signature, or return with a reason); plus the
 * lifecycle of a recipe's versions. Thin: parse, call the service, answer.
 */
import { Router, type ErrorRequestHandler } from 'express';
import { z } from 'zod';
import { decideSchema, evidenceSchema, recipeLifecycleSchema, reviewListQuerySchema, reviewListSchema, submissionSchema, submitReviewSchema } from '@/shared/api/approval';
import type { AppDeps } from '../deps';
import { labRoute, type LabRequest } from '../auth/permissions';
import { AppError } from '../errors';
import { decide, getEvidence, getSubmission, listSubmissions, recordRoleRefusal, submitForReview } from '../services/approval';
import { recipeLifecycle } from '../services/standards';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });

export function reviewRoutes(deps: AppDeps): Router {
  const r = Router();
  const { db } = deps;
  const review = { db, mailer: deps.mailer, publicUrl: deps.config.publicUrl };
  const base = '/labs/:labId/reviews';
  const viewer = (req: LabRequest) => ({ id: req.user.id, role: req.lab.role, policy: { adminCoolingDays: deps.config.approvalAdminCoolingDays, now: deps.clock.now() } });
  labRoute(r, db, { method: 'get', path: base, action: 'reviews.read', summary: 'Review submissions: the inbox (status=pending) and past decisions', query: reviewListQuerySchema, response: reviewListSchema }, async (req, res) => {
    res.json(await listSubmissions(db, req.lab.id, parseBody(reviewListQuerySchema, req.query), viewer(req)));
  });
  labRoute(r, db, { method: 'post', path: base, action: 'reviews.submit', summary: 'Submit a recipe version with its evidence studies for review', body: submitReviewSchema, response: submissionSchema, status: 201 }, async (req, res) => {
    res.status(201).json(await submitForReview(review, req.lab.id, viewer(req), parseBody(submitReviewSchema, req.body)));
  });
  labRoute(r, db, { method: 'get', path: `${base}/:id`, action: 'reviews.read', summary: 'A submission, its decision, and why you may not decide it', response: submissionSchema }, async (req, res) => {
    res.json(await getSubmission(db, req.lab.id, parseBody(idParam, req.params).id, viewer(req)));
  });
  labRoute(r, db, { method: 'get', path: `${base}/:id/evidence`, action: 'reviews.read', summary: 'The evidence of a submission: recipe, studies, criteria and which passed', response: evidenceSchema }, async (req, res) => {
    res.json(await getEvidence(db, req.lab.id, parseBody(idParam, req.params).id, viewer(req)));
  });
  labRoute(r, db, { method: 'post', path: `${base}/:id/decision`, action: 'reviews.decide', summary: 'Approve (signed with your password) or return a submission', body: decideSchema, response: submissionSchema }, async (req, res) => {
    res.json(await decide(review, req.lab.id, viewer(req), parseBody(idParam, req.params).id, parseBody(decideSchema, req.body)));
  });
  // A decision refused by the permission table (an analyst, an auditor, an admin) is logged too.
  const logRoleRefusal: ErrorRequestHandler = async (err, req, _res, next) => {
    if (!(err instanceof AppError && err.code === 'forbidden' && req.method === 'POST' && req.user)) return next(err);
    next((await recordRoleRefusal(db, String(req.params.labId), req.user.id, String(req.params.id))) ?? err);
  };
  r.use(`${base}/:id/decision`, logRoleRefusal);
  labRoute(r, db, { method: 'get', path: '/labs/:labId/recipes/:id/lifecycle', action: 'recipes.read', summary: "Every version of a recipe with its review state", response: recipeLifecycleSchema }, async (req, res) => {
    res.json(await recipeLifecycle(db, req.lab.id, parseBody(idParam, req.params).id));
  });
  return r;
}
