/**
 * In test mode a route's JSON answer is checked against the response schema it was registered
 * with (server/auth/permissions.ts, checkedResponse): a success answer of the wrong shape becomes
 * a 500 whose logged error names the route and the path of the mismatch; a matching answer and
 * error answers pass through unchanged.
 */
import express, { Router, type ErrorRequestHandler } from 'express';
import request from 'supertest';
import { z } from 'zod';
import { openRoute } from '@/server/auth/permissions';

const answerSchema = z.object({ items: z.array(z.object({ id: z.string(), hz: z.number() })) });

function appAnswering(body: unknown, status = 200) {
  const logged: string[] = [];
  const r = Router();
  openRoute(r, { method: 'get', path: '/checked', action: 'public', summary: 'test route', response: answerSchema }, (_req, res) => {
    res.status(status).json(body);
  });
  const app = express();
  app.use(r);
  const onError: ErrorRequestHandler = (err, _req, res, _next) => {
    logged.push(err instanceof Error ? err.message : String(err));
    res.status(500).json({ error: { code: 'internal' } });
  };
  app.use(onError);
  return { app, logged };
}

describe('response schema check in test mode', () => {
  it('runs under NODE_ENV=test (jest sets it)', () => {
    expect(process.env.NODE_ENV).toBe('test');
  });

  it('passes an answer that matches the schema', async () => {
    const { app, logged } = appAnswering({ items: [{ id: 'a', hz: 50 }] });
    const res = await request(app).get('/checked');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ items: [{ id: 'a', hz: 50 }] });
    expect(logged).toEqual([]);
  });

  it('turns a mismatching answer into a 500 naming the route and the path', async () => {
    const { app, logged } = appAnswering({ items: [{ id: 'a', hz: '50' }] });
    const res = await request(app).get('/checked');
    expect(res.status).toBe(500);
    expect(logged).toHaveLength(1);
    expect(logged[0]).toContain('GET /checked');
    expect(logged[0]).toContain('items.0.hz');
  });

  it('checks the answer as the client reads it, after JSON (NaN travels as null)', async () => {
    const { app, logged } = appAnswering({ items: [{ id: 'a', hz: Number.NaN }] });
    const res = await request(app).get('/checked');
    expect(res.status).toBe(500);
    expect(logged[0]).toContain('items.0.hz');
  });

  it('leaves error answers alone (they have their own shape)', async () => {
    const { app, logged } = appAnswering({ error: { code: 'not_found', message: 'x' } }, 404);
    const res = await request(app).get('/checked');
    expect(res.status).toBe(404);
    expect(logged).toEqual([]);
  });
});
