/**
 * The engine's one error type for bad input. Every option resolver validates early and throws
 * this with the field and the offending value, e.g. `overlap=1.2 must be in [0, 1)`.
 * Adjustments that are not errors are returned as warnings on results, never made silently.
 */
export class EngineInputError extends Error {
  readonly field: string;
  readonly value: unknown;

  constructor(field: string, value: unknown, rule: string) {
    super(`${field}=${formatValue(value)} ${rule}`);
    this.name = 'EngineInputError';
    this.field = field;
    this.value = value;
  }
}

function formatValue(value: unknown): string {
  if (typeof value === 'number' || typeof value === 'boolean' || value === null || value === undefined) {
    return String(value);
  }
  if (typeof value === 'string') return JSON.stringify(value);
  try {
    return JSON.stringify(value);
  } catch {
    return String(value);
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(field: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new EngineInputError(field, value, 'must be a finite number');
  }
}
