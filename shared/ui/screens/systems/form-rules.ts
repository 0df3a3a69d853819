/**
 * Form validation with the server's own rules: the request body's zod schema (shared/api), then
 * the engine's parser for the cross-field rules the server also applies (checkedByEngine). Zod's
 * generic messages for empty and out-of-range numbers are put in plain words; messages the
 * schemas write themselves are kept.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';
import { EngineInputError } from '@/shared/engine/errors';

type Issue = { code: string; input?: unknown; expected?: string; origin?: string; minimum?: unknown; maximum?: unknown; inclusive?: boolean };

/** Plain words for zod's generic issues; undefined keeps zod's (or the schema's) own message. */
export function friendlyIssue(issue: Issue): string | undefined {
  const missing = issue.input === undefined || (typeof issue.input === 'number' && Number.isNaN(issue.input));
  if (issue.code === 'invalid_type' && issue.expected === 'number') return missing ? 'Enter a number' : 'Must be a number';
  if (issue.code === 'invalid_type' && missing) return 'Required';
  if (issue.code === 'too_small' && issue.origin === 'number') return `Must be ${issue.inclusive ? '≥' : '>'} ${issue.minimum}`;
  if (issue.code === 'too_big' && issue.origin === 'number') return `Must be ${issue.inclusive ? '≤' : '<'} ${issue.maximum}`;
  if (issue.code === 'too_small' && issue.origin === 'string' && issue.minimum === 1) return 'Required';
  if (issue.code === 'too_small' && issue.origin === 'array') return `Needs at least ${issue.minimum}`;
  if (issue.code === 'invalid_format' || (issue.code === 'invalid_type' && issue.expected === 'int')) return 'Enter a whole number';
  return undefined;
}

/** The rule part of an EngineInputError ("field=value rule" → "rule"). */
export function engineRule(err: EngineInputError): string {
  const rest = err.message.slice(err.field.length + 1);
  const space = rest.indexOf(' ');
  return space < 0 ? rest : rest.slice(space + 1);
}

/** A dotted engine field ("modes.0.dampingRatio") as a form path under `definition`. */
export function definitionPath(field: string, dropPrefix?: string): (string | number)[] {
  const parts = field.split('.').filter(Boolean);
  if (dropPrefix && parts[0] === dropPrefix) parts.shift();
  return ['definition', ...parts.map((p) => (/^\d+$/.test(p) ? Number(p) : p))];
}

/**
 * A resolver for a create/update body: the zod schema, then `parse(body.definition)` (the engine's
 * parser), whose EngineInputError becomes an error on the named field.
 */
export function engineCheckedResolver<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
  parse: (definition: unknown) => unknown,
  dropPrefix?: string,
): Resolver<z.input<S>, unknown, z.output<S>> {
  const checked = schema.superRefine((body, ctx) => {
    try {
      parse(body.definition);
    } catch (err) {
      if (!(err instanceof EngineInputError)) throw err;
      ctx.addIssue({ code: 'custom', path: definitionPath(err.field, dropPrefix), message: engineRule(err) });
    }
  });
  return zodResolver(checked, { error: (issue: Issue) => friendlyIssue(issue) });
}

/** The message of the error at a dotted path of react-hook-form's errors, if any. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' && message ? message : undefined;
}
