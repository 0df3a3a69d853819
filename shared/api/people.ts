/**
 * Request and response schemas of the people side of the API: members and roles, invitations,
 * password reset, the lab's settings, the mail outbox and the audit trail. Times are milliseconds
 * since the Unix epoch (UTC). Lists take ?limit&offset and answer { items, total, limit, offset }.
 */
import { z } from 'zod';
import { roleSchema } from './auth';

const email = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.test').max(254);
const millis = z.number().int();

export const pageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});

/** A page of a list: the items, the count of all that match, and the page asked for. */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({ items: z.array(item), total: z.number().int(), limit: z.number().int(), offset: z.number().int() });

// ---- passwords ------------------------------------------------------------------------------

export const PASSWORD_MIN_LENGTH = 12;

/** A short list of passwords seen most often in published breach corpora (common practice: refuse them). */
export const COMMON_PASSWORDS = [
  '123456789012', '1234567890123', 'password1234', 'password12345', 'passwordpassword', 'qwertyuiop12',
  'qwertyuiopas', '111111111111', '000000000000', 'iloveyou1234', 'letmein12345', 'welcome12345',
  'administrator', 'changeme1234', 'abc123456789', 'aaaaaaaaaaaa', 'trustno11234', 'monkey123456',
  'football1234', 'baseball1234', 'sunshine1234', 'princess1234', 'dragon123456', 'master123456',
  'plumbline123', 'plumbline2026',
];

/** Why a password is refused, or null when it is acceptable. Same rules on client and server. */
export function passwordProblem(password: string, userEmail: string): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
  if (password.length > 1024) return 'Use at most 1024 characters.';
  const lower = password.trim().toLowerCase();
  const mail = userEmail.trim().toLowerCase();
  if (lower === mail || lower === mail.split('@')[0]) return 'Do not use your e-mail address as the password.';
  if (COMMON_PASSWORDS.includes(lower)) return 'This password is too common; choose another.';
  return null;
}

const password = z.string().min(1, 'Enter a password').max(1024);

// ---- members --------------------------------------------------------------------------------

export const memberSortSchema = z.enum(['displayName', 'email', 'role', 'joinedAt']);

export const memberListQuerySchema = pageQuerySchema.extend({
  sort: memberSortSchema.default('displayName'),
  order: z.enum(['asc', 'desc']).default('asc'),
  /** Matches display name or e-mail, case-insensitive. */
  q: z.string().trim().max(100).optional(),
  role: roleSchema.optional(),
});
export type MemberListQuery = z.infer<typeof memberListQuerySchema>;

export const memberSchema = z.object({
  userId: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  joinedAt: millis,
});
export type Member = z.infer<typeof memberSchema>;
export const memberListSchema = pageOf(memberSchema);
export type MemberList = z.infer<typeof memberListSchema>;

export const changeRoleRequestSchema = z.object({ role: roleSchema });
export type ChangeRoleRequest = z.infer<typeof changeRoleRequestSchema>;

// ---- invitations ----------------------------------------------------------------------------

export const createInvitationRequestSchema = z.object({ email, role: roleSchema });
export type CreateInvitationRequest = z.infer<typeof createInvitationRequestSchema>;

export const invitationStatusSchema = z.enum(['pending', 'accepted', 'revoked', 'expired']);

export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  status: invitationStatusSchema,
  invitedBy: z.object({ userId: z.string(), displayName: z.string() }).nullable(),
  createdAt: millis,
  expiresAt: millis,
  usedAt: millis.nullable(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const invitationListQuerySchema = pageQuerySchema.extend({ status: invitationStatusSchema.optional() });
export type InvitationListQuery = z.infer<typeof invitationListQuerySchema>;
export const invitationListSchema = pageOf(invitationSchema);

/** GET /api/v1/invitations/:token: what the accept page shows before the invitee sets a password. */
export const invitationPreviewSchema = z.object({
  labName: z.string(),
  email: z.string(),
  role: roleSchema,
  expiresAt: millis,
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

/** New accounts give a display name and a new password; existing accounts their current password. */
export const acceptInvitationRequestSchema = z.object({
  displayName: z.string().trim().min(1, 'Enter your name').max(100).optional(),
  password,
});
export type AcceptInvitationRequest = z.infer<typeof acceptInvitationRequestSchema>;

// ---- password reset -------------------------------------------------------------------------

export const passwordResetRequestSchema = z.object({ email });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetConfirmSchema = z.object({ token: z.string().min(10).max(200), password });
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirmSchema>;

/** The same answer whether or not the address has an account. */
export const passwordResetAnswerSchema = z.object({ message: z.string() });

// ---- the lab --------------------------------------------------------------------------------

export const labSchema = z.object({
  id: z.string(),
  name: z.string(),
  slug: z.string(),
  /** Printed at the foot of the lab's validation reports. */
  reportFooter: z.string(),
  createdAt: millis,
  updatedAt: millis.nullable(),
  /** The caller's role in this lab. */
  role: roleSchema,
});
export type Lab = z.infer<typeof labSchema>;

export const updateLabRequestSchema = z
  .object({
    name: z.string().trim().min(2).max(120).optional(),
    reportFooter: z.string().max(2000).optional(),
  })
  .refine((v) => v.name !== undefined || v.reportFooter !== undefined, { message: 'Change at least one setting' });
export type UpdateLabRequest = z.infer<typeof updateLabRequestSchema>;

// ---- mail -----------------------------------------------------------------------------------

export const mailListQuerySchema = pageQuerySchema;
export const mailMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  kind: z.string(),
  status: z.enum(['queued', 'sent', 'failed']),
  error: z.string().nullable(),
  createdAt: millis,
  sentAt: millis.nullable(),
});
export type MailMessage = z.infer<typeof mailMessageSchema>;
export const mailListSchema = pageOf(mailMessageSchema);

// ---- audit trail ----------------------------------------------------------------------------

/** A day (YYYY-MM-DD, UTC) or a full ISO 8601 time. `to` is exclusive; a bare day means its end. */
const when = z.string().refine((s) => !Number.isNaN(Date.parse(s)), 'Use a date such as 2026-12-01 or an ISO time');

export const auditListQuerySchema = pageQuerySchema.extend({
  /** An action, or a family with a trailing *, e.g. members.* */
  action: z.string().max(80).optional(),
  /** The acting user's id. */
  actor: z.string().max(80).optional(),
  from: when.optional(),
  to: when.optional(),
});
export type AuditListQuery = z.infer<typeof auditListQuerySchema>;

export const auditEventSchema = z.object({
  id: z.number().int(),
  labId: z.string().nullable(),
  actor: z.object({ userId: z.string(), displayName: z.string().nullable(), email: z.string().nullable() }).nullable(),
  action: z.string(),
  targetType: z.string(),
  targetId: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
  at: millis,
  prevHash: z.string().nullable(),
  hash: z.string(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;
export const auditListSchema = pageOf(auditEventSchema);

export const auditVerifySchema = z.object({
  ok: z.boolean(),
  checked: z.number().int(),
  firstBroken: z.object({ id: z.number().int(), reason: z.enum(['hash_mismatch', 'link_mismatch']) }).nullable(),
});
export type AuditVerify = z.infer<typeof auditVerifySchema>;
