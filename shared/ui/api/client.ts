/**
 * The client's one way to talk to Plumbline's server: same-origin `/api/...`, cookies included,
 * JSON both ways. Every failure becomes an `ApiRequestError`; `errorText` turns any error into
 * a sentence for the user.
 */
import type { z } from 'zod';
import { apiErrorSchema } from '@/shared/api/auth';

export class ApiRequestError extends Error {
  override readonly name = 'ApiRequestError';
  constructor(
    /** HTTP status, or 0 when the server could not be reached. */
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type RequestOptions<T> = {
  method?: Method;
  body?: unknown;
  /** Validates the answer; without it the body is returned as `unknown`. */
  schema?: z.ZodType<T>;
  signal?: AbortSignal;
  /** Messages for statuses whose meaning depends on the call, used when the server sends none. */
  messages?: Partial<Record<number, string>>;
};

const statusMessages: Record<number, string> = {
  400: 'The request was not accepted. Check the values and try again.',
  401: 'You are signed out. Sign in again to continue.',
  403: 'Your role in this lab does not allow this.',
  404: 'This item was not found. It may have been removed.',
  409: 'Someone changed this in the meantime. Reload and try again.',
  413: 'The file is too large.',
  429: 'Too many attempts. Wait a minute and try again.',
};

const unreachableMessage =
  "Plumbline's server could not be reached. Check the connection and try again.";

async function readBody(response: Response): Promise<unknown> {
  const text = await response.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

export async function apiRequest<T = unknown>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  if (!path.startsWith('/api/')) throw new Error(`apiRequest: path "${path}" must start with /api/`);
  const { method = 'GET', body, schema, signal, messages } = options;
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      credentials: 'include',
      headers: {
        Accept: 'application/json',
        ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiRequestError(0, 'unreachable', unreachableMessage, cause);
  }

  const payload = await readBody(response);
  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(payload);
    const serverMessage = parsed.success ? parsed.data.error.message.trim() : '';
    const message =
      serverMessage ||
      messages?.[response.status] ||
      statusMessages[response.status] ||
      `The server had a problem (HTTP ${response.status}). Try again in a moment.`;
    const code = parsed.success ? parsed.data.error.code : `http_${response.status}`;
    throw new ApiRequestError(response.status, code, message, parsed.success ? parsed.data.error.details : undefined);
  }
  if (!schema) return payload as T;
  const checked = schema.safeParse(payload);
  if (!checked.success) {
    throw new ApiRequestError(
      response.status,
      'unexpected_response',
      "The server's answer was not understood. Reload the page; if it persists, tell your lab admin.",
      checked.error.issues,
    );
  }
  return checked.data;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'POST', body }),
};

export function isApiStatus(err: unknown, status: number): err is ApiRequestError {
  return err instanceof ApiRequestError && err.status === status;
}

/** Any error, as one sentence a user can act on. Never shows a stack or an internal name. */
export function errorText(err: unknown): string {
  if (err instanceof ApiRequestError) return err.message;
  if (err instanceof Error && err.name === 'AbortError') return 'The request was cancelled.';
  if (err instanceof TypeError) return unreachableMessage;
  return 'Something went wrong. Try again; if it persists, tell your lab admin.';
}
