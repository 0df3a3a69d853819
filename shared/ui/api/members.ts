/** Members of the current lab and their roles; the lab's sent mail (fake mail server only). */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@/shared/api/auth';
import { changeRoleRequestSchema, mailListSchema, memberListSchema, memberSchema } from '@/shared/api/people';
import { api, apiRequest } from './client';
import { labPath } from './labs';

export const memberKeys = {
  all: ['members'] as const,
  list: (labId: string) => [...memberKeys.all, labId, 'list'] as const,
  mail: (labId: string) => ['mail', labId] as const,
};

export function useMembers(labId: string) {
  return useQuery({
    queryKey: memberKeys.list(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/members?limit=200'), { schema: memberListSchema, signal }),
    enabled: labId !== '',
  });
}

export function useChangeRole(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) =>
      apiRequest(labPath(labId, `/members/${encodeURIComponent(userId)}`), { method: 'PATCH', body: changeRoleRequestSchema.parse({ role }), schema: memberSchema }),
    onSuccess: () => void client.invalidateQueries({ queryKey: memberKeys.list(labId) }),
  });
}

/** The outbox; the server answers 409 mail_view_off when real SMTP is configured. */
export function useSentMail(labId: string, enabled = true) {
  return useQuery({
    queryKey: memberKeys.mail(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/mail?limit=50'), { schema: mailListSchema, signal }),
    enabled: enabled && labId !== '',
  });
}
