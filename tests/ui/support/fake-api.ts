/** A stand-in for the server behind `fetch`: answers by "METHOD /path" and records each call. */
import type { MeResponse } from '@/shared/api/auth';

export type FakeAnswer = { status: number; body?: unknown };
type Handler = FakeAnswer | ((request: { body: unknown }) => FakeAnswer);

export const demoMe: MeResponse = {
  user: { id: 'user-analyst', email: 'mira.okafor@example.test', displayName: 'Mira Okafor' },
  memberships: [{ labId: 'lab-harbor-ridge', labName: 'Harbor Ridge Test Lab', role: 'analyst' }],
};

/** GET /api/v1/auth/session answers 200 with `{ me: null }` when nobody is signed in. */
export const signedOut: FakeAnswer = { status: 200, body: { me: null } };
export const signedInAs = (me: MeResponse): FakeAnswer => ({ status: 200, body: { me } });

export function installFakeApi(routes: Record<string, Handler>) {
  const calls: { method: string; path: string; body: unknown; credentials?: RequestCredentials }[] = [];
  const fetchMock = jest.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const method = (init.method ?? 'GET').toUpperCase();
    const path = String(input);
    const body = typeof init.body === 'string' ? JSON.parse(init.body) : undefined;
    calls.push({ method, path, body, credentials: init.credentials });
    const handler = routes[`${method} ${path}`];
    const answer: FakeAnswer = handler
      ? typeof handler === 'function'
        ? handler({ body })
        : handler
      : { status: 404, body: { error: { code: 'not_found', message: `No route ${method} ${path}` } } };
    const text = answer.body === undefined ? '' : JSON.stringify(answer.body);
    // jsdom has no Response; the client only reads ok, status and text().
    return { ok: answer.status >= 200 && answer.status < 300, status: answer.status, text: async () => text };
  });
  globalThis.fetch = fetchMock as unknown as typeof fetch;
  return { calls, fetchMock };
}
