/** The current lab's settings (name, report footer) and the caller's role in it. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { labSchema, type UpdateLabRequest } from '@/shared/api/people';
import { apiRequest, api } from './client';

export const labKeys = {
  all: ['labs'] as const,
  detail: (labId: string) => [...labKeys.all, labId] as const,
};

export const labPath = (labId: string, rest = '') => `/api/v1/labs/${encodeURIComponent(labId)}${rest}`;

export function useLabSettings(labId: string) {
  return useQuery({
    queryKey: labKeys.detail(labId),
    queryFn: ({ signal }) => api.get(labPath(labId), { schema: labSchema, signal }),
    enabled: labId !== '',
  });
}

export function useUpdateLab(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (patch: UpdateLabRequest) => apiRequest(labPath(labId), { method: 'PATCH', body: patch, schema: labSchema }),
    onSuccess: (lab) => client.setQueryData(labKeys.detail(labId), lab),
  });
}
