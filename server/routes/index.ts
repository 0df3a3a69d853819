/**
 * Every /api/v1 route, mounted in one place. Add a resource by adding one line here.
 */
import { Router } from 'express';
import type { AppDeps } from '../app';
import { AttemptLimiter } from '../services/sign-in';
import { authRoutes } from './auth';

export function v1Routes(deps: AppDeps): Router {
  const r = Router();
  r.use(authRoutes({ ...deps, limiter: new AttemptLimiter() }));
  return r;
}
