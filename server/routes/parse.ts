import type { z } from 'zod';
import { AppError } from '../errors';

/** Parses a request part with a shared schema; a failure is a 400 naming each field. */
export function parseBody<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data;
  const fields = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
  const first = fields[0];
  throw new AppError(400, 'invalid_request', first ? `${first.path || 'body'}: ${first.message}` : 'Invalid request.', { fields });
}
