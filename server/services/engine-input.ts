/**
 * The engine reports bad input as EngineInputError (field, value, rule). At the API boundary that
 * becomes a 400 with the field path in `details`, like a zod failure.
 */
import { EngineInputError } from '@/shared/engine/errors';
import { AppError } from '../errors';

/** Runs `fn`; an EngineInputError becomes a 400 naming `where` and the field. */
export function checkedByEngine<T>(where: string, fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    throw toAppError(where, err);
  }
}

/** An EngineInputError as a 400 AppError; anything else unchanged. */
export function toAppError(where: string, err: unknown): unknown {
  if (err instanceof EngineInputError) {
    const path = where ? `${where}.${err.field}` : err.field;
    return new AppError(400, 'invalid_request', `${where ? `${where}: ` : ''}${err.message}`, {
      fields: [{ path, message: err.message }],
    });
  }
  return err;
}
