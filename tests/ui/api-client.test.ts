import { z } from 'zod';
import { api, apiRequest, ApiRequestError, errorText } from '@/shared/ui/api/client';
import { installFakeApi } from './support/fake-api';

async function caught(promise: Promise<unknown>): Promise<unknown> {
  try {
    await promise;
  } catch (err) {
    return err;
  }
  throw new Error('expected the request to fail');
}

describe('api client', () => {
  test('sends JSON to the same origin with cookies and returns the checked body', async () => {
    const fake = installFakeApi({ 'POST /api/v1/things': { status: 200, body: { id: 'a1', extra: true } } });
    const answer = await api.post('/api/v1/things', { name: 'frame' }, { schema: z.object({ id: z.string() }) });
    expect(answer).toEqual({ id: 'a1' });
    expect(fake.calls[0]).toEqual({
      method: 'POST',
      path: '/api/v1/things',
      body: { name: 'frame' },
      credentials: 'include',
    });
    const init = fake.fetchMock.mock.calls[0][1] as RequestInit;
    expect(init.headers).toMatchObject({ 'Content-Type': 'application/json', Accept: 'application/json' });
  });

  test('an error body becomes an ApiRequestError with its code, message and details', async () => {
    installFakeApi({
      'GET /api/v1/recipes/9': {
        status: 409,
        body: { error: { code: 'version_conflict', message: 'The recipe changed meanwhile.', details: { version: 3 } } },
      },
    });
    const err = await caught(api.get('/api/v1/recipes/9'));
    expect(err).toBeInstanceOf(ApiRequestError);
    expect(err).toMatchObject({ status: 409, code: 'version_conflict', details: { version: 3 } });
    expect(errorText(err)).toBe('The recipe changed meanwhile.');
  });

  test('a failure without an error body gets a message by status', async () => {
    installFakeApi({ 'GET /api/v1/a': { status: 403 }, 'GET /api/v1/b': { status: 502 } });
    expect(errorText(await caught(api.get('/api/v1/a')))).toBe('Your role in this lab does not allow this.');
    expect(errorText(await caught(api.get('/api/v1/b')))).toBe(
      'The server had a problem (HTTP 502). Try again in a moment.',
    );
  });

  test('a server that cannot be reached is status 0 with a sentence about the connection', async () => {
    globalThis.fetch = jest.fn(async () => {
      throw new TypeError('Failed to fetch');
    }) as unknown as typeof fetch;
    const err = await caught(api.get('/api/v1/me'));
    expect(err).toMatchObject({ status: 0, code: 'unreachable' });
    expect(errorText(err)).toMatch(/could not be reached/);
  });

  test('an answer that does not match the schema is reported, not passed on', async () => {
    installFakeApi({ 'GET /api/v1/me': { status: 200, body: { user: 'nobody' } } });
    const err = await caught(api.get('/api/v1/me', { schema: z.object({ user: z.object({ id: z.string() }) }) }));
    expect(err).toMatchObject({ code: 'unexpected_response' });
  });

  test('only /api/ paths are accepted', async () => {
    await expect(apiRequest('https://elsewhere.example.test/api/v1/me')).rejects.toThrow(/must start with \/api\//);
  });

  test('errorText never shows an internal message', () => {
    expect(errorText(new Error('SQLITE_BUSY: database is locked'))).toBe(
      'Something went wrong. Try again; if it persists, tell your lab admin.',
    );
    expect(errorText('a string')).toMatch(/^Something went wrong/);
  });
});
