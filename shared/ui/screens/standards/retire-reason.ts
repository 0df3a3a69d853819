/** The retire form's reason error from the server's answer (details.fields of a refused request). */
import { ApiRequestError } from '@/shared/ui/api/client';

export function retireFieldError(error: unknown): string | undefined {
  if (!(error instanceof ApiRequestError)) return undefined;
  const fields = (error.details as { fields?: { path: string; message: string }[] } | undefined)?.fields;
  return Array.isArray(fields) ? fields.find((f) => f.path === 'reason')?.message : undefined;
}
