import { Router } from 'express';
import { databaseReachable, type Db } from '../db/knex';
import type { HealthResponse } from '@/shared/api/auth';

export function healthRoutes(deps: { db: Db; version: string }): Router {
  const r = Router();
  r.get('/health', async (_req, res) => {
    const ok = await databaseReachable(deps.db);
    const body: HealthResponse = { status: ok ? 'ok' : 'degraded', version: deps.version, database: ok ? 'ok' : 'unavailable' };
    res.status(ok ? 200 : 503).json(body);
  });
  return r;
}
