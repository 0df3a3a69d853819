import type { z } from 'zod';
import { AppError } from '../errors';

/**
 * Parses a request part with a shared schema; a failure is a 400 naming each field. With
 * `plain`, the schema's messages are written for people (a form's field errors, naming the field
 * in words) and the answer's message is the first of them as it stands.
 */
export function parseBody<S extends z.ZodType>(schema: S, value: unknown, opts: { plain?: boolean } = {}): z.infer<S> {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data;
  const fields = parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
  const first = fields[0];
  const message = !first ? 'Invalid request.' : opts.plain ? first.message : `${first.path || 'body'}: ${first.message}`;
  throw new AppError(400, 'invalid_request', message, { fields });
}
