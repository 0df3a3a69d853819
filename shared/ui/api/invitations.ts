/**
 * Mailed single-use links: invitations (created and revoked by an admin, previewed and accepted by
 * the invitee) and password reset (asked for by address, confirmed with the link's token).
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { meResponseSchema } from '@/shared/api/auth';
import {
  acceptInvitationRequestSchema,
  createInvitationRequestSchema,
  invitationListSchema,
  invitationPreviewSchema,
  invitationSchema,
  passwordResetAnswerSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  type AcceptInvitationRequest,
  type CreateInvitationRequest,
} from '@/shared/api/people';
import { api, apiRequest } from './client';
import { labPath } from './labs';
import { sessionKeys } from './use-session';

export const invitationKeys = {
  all: ['invitations'] as const,
  list: (labId: string) => [...invitationKeys.all, labId, 'list'] as const,
  preview: (token: string) => [...invitationKeys.all, 'preview', token] as const,
};

export function useInvitations(labId: string) {
  return useQuery({
    queryKey: invitationKeys.list(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/invitations?limit=100'), { schema: invitationListSchema, signal }),
    enabled: labId !== '',
  });
}

export function useInvite(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (request: CreateInvitationRequest) =>
      api.post(labPath(labId, '/invitations'), createInvitationRequestSchema.parse(request), { schema: invitationSchema }),
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: invitationKeys.list(labId) });
      void client.invalidateQueries({ queryKey: ['mail', labId] });
    },
  });
}

export function useRevokeInvitation(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => apiRequest(labPath(labId, `/invitations/${encodeURIComponent(id)}`), { method: 'DELETE' }),
    onSuccess: () => void client.invalidateQueries({ queryKey: invitationKeys.list(labId) }),
  });
}

export function useInvitationPreview(token: string) {
  return useQuery({
    queryKey: invitationKeys.preview(token),
    queryFn: ({ signal }) => api.get(`/api/v1/invitations/${encodeURIComponent(token)}`, { schema: invitationPreviewSchema, signal }),
    enabled: token !== '',
    retry: false,
  });
}

/** Accepting signs the invitee in: the answer becomes the session. */
export function useAcceptInvitation(token: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (request: AcceptInvitationRequest) =>
      api.post(`/api/v1/invitations/${encodeURIComponent(token)}/accept`, acceptInvitationRequestSchema.parse(request), {
        schema: meResponseSchema,
        messages: { 401: 'The password is not right.', 404: 'This invitation link is not valid any more.' },
      }),
    onSuccess: (me) => {
      client.removeQueries({ predicate: (q) => q.queryKey[0] !== sessionKeys.all[0] });
      client.setQueryData(sessionKeys.me(), me);
    },
  });
}

export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (email: string) =>
      api.post('/api/v1/auth/password-reset', passwordResetRequestSchema.parse({ email }), { schema: passwordResetAnswerSchema }),
  });
}

export function useConfirmPasswordReset() {
  return useMutation({
    mutationFn: (request: { token: string; password: string }) =>
      api.post('/api/v1/auth/password-reset/confirm', passwordResetConfirmSchema.parse(request), {
        messages: { 404: 'This reset link is not valid any more. Ask for a new one.', 410: 'This reset link has expired. Ask for a new one.' },
      }),
  });
}
