/** Request and response schemas of the sign-in API, shared by client and server. */
import { z } from 'zod';

export const signInRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.test'),
  password: z.string().min(1, 'Enter your password').max(1024),
});
export type SignInRequest = z.infer<typeof signInRequestSchema>;

export const roleSchema = z.enum(['admin', 'analyst', 'reviewer', 'auditor']);
export type Role = z.infer<typeof roleSchema>;

export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
});
export type User = z.infer<typeof userSchema>;

export const membershipSchema = z.object({
  labId: z.string(),
  labName: z.string(),
  role: roleSchema,
});
export type Membership = z.infer<typeof membershipSchema>;

/** GET /api/v1/me and the answer of POST /api/v1/auth/sign-in. */
export const meResponseSchema = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
});
export type MeResponse = z.infer<typeof meResponseSchema>;

/** GET /api/v1/auth/session: who is signed in, or `null` — always 200, so a signed-out visit
 * does not make the browser log a failed request. */
export const sessionResponseSchema = z.object({ me: meResponseSchema.nullable() });
export type SessionResponse = z.infer<typeof sessionResponseSchema>;

/** Every error the API returns has this shape. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

export const healthResponseSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  database: z.enum(['ok', 'unavailable']),
});
export type HealthResponse = z.infer<typeof healthResponseSchema>;
