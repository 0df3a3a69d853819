/**
 * A new password and its repetition, refined with the server's own rule (passwordProblem from
 * shared/api/people), so the form refuses what the server would refuse.
 */
import { z } from 'zod';
import { passwordProblem, PASSWORD_MIN_LENGTH } from '@/shared/api/people';

export const passwordHint = `At least ${PASSWORD_MIN_LENGTH} characters; not your e-mail address, not a common password.`;

/** Checks `password` with the server's rule for `email` and that `repeat` matches it. */
export function checkNewPassword(value: { password: string; repeat: string }, email: string, ctx: z.RefinementCtx) {
  const problem = passwordProblem(value.password, email);
  if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
  else if (value.password !== value.repeat) ctx.addIssue({ code: 'custom', path: ['repeat'], message: 'The two passwords differ' });
}

export const newPasswordSchema = (email: string) =>
  z.object({ password: z.string(), repeat: z.string() }).superRefine((v, ctx) => checkNewPassword(v, email, ctx));
