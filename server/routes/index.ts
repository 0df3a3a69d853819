/**
 * Every /api/v1 route, mounted in one place. Add a resource by adding one line here.
 */
import { Router } from 'express';
import type { AppDeps } from '../deps';
import { auditRoutes } from './audit';
import { authRoutes } from './auth';
import { invitationRoutes } from './invitations';
import { labRoutes } from './labs';
import { mailRoutes } from './mail';
import { openApiRoutes } from './openapi';
import { passwordResetRoutes } from './password-reset';
import { peopleRoutes } from './people';
import { reviewRoutes } from './reviews';
import { standardRoutes } from './standards';
import { reportRoutes } from './reports';
import { systemRoutes } from './systems';
import { scenarioRoutes } from './scenarios';
import { recipeRoutes } from './recipes';
import { studyRoutes } from './studies';
import { sweepRoutes } from './sweeps';
import { uploadRoutes } from './uploads';
import { exportRoutes } from './exports';

export function v1Routes(deps: AppDeps): Router {
  const r = Router();
  r.use(authRoutes(deps));
  r.use(passwordResetRoutes(deps));
  r.use(invitationRoutes(deps));
  r.use(labRoutes(deps));
  r.use(peopleRoutes(deps));
  r.use(mailRoutes(deps));
  r.use(auditRoutes(deps));
  r.use(systemRoutes(deps));
  r.use(scenarioRoutes(deps));
  r.use(recipeRoutes(deps));
  r.use(studyRoutes(deps));
  r.use(sweepRoutes(deps));
  r.use(uploadRoutes(deps));
  r.use(exportRoutes(deps));
  r.use(reviewRoutes(deps));
  r.use(reportRoutes(deps));
  r.use(standardRoutes(deps));
  r.use(openApiRoutes(deps));
  return r;
}
