/** The current lab's register of approved standards: filter by scope, one standard, retire. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { reverifySchema, standardListSchema, standardSchema, type StandardListQuery } from '@/shared/api/approval';
import { api } from './client';
import { labPath } from './labs';

/** The filters the register screen offers (all optional; status defaults to active). */
export type StandardFilter = Partial<Pick<StandardListQuery, 'structureType' | 'lowHz' | 'highHz' | 'dampingPercent' | 'excitation' | 'dueBefore'>> & {
  status?: StandardListQuery['status'];
  limit?: number;
};

export const standardKeys = {
  all: ['standards'] as const,
  lab: (labId: string) => [...standardKeys.all, labId] as const,
  list: (labId: string, filter: StandardFilter = {}) => [...standardKeys.lab(labId), 'list', filter] as const,
  detail: (labId: string, id: string) => [...standardKeys.lab(labId), 'detail', id] as const,
};

export function standardQueryString(filter: StandardFilter): string {
  const q = new URLSearchParams();
  for (const [key, value] of Object.entries(filter)) if (value !== undefined && value !== '') q.set(key, String(value));
  if (!q.has('limit')) q.set('limit', '50');
  return q.toString();
}

export function useStandards(labId: string, filter: StandardFilter = {}) {
  return useQuery({
    queryKey: standardKeys.list(labId, filter),
    queryFn: ({ signal }) => api.get(labPath(labId, `/standards?${standardQueryString(filter)}`), { schema: standardListSchema, signal }),
    enabled: labId !== '',
  });
}

export function useStandard(labId: string, id: string) {
  return useQuery({
    queryKey: standardKeys.detail(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/standards/${encodeURIComponent(id)}`), { schema: standardSchema, signal }),
    enabled: labId !== '' && id !== '',
  });
}

export function useRetireStandard(labId: string, id: string) {
  const client = useQueryClient();
  return useMutation({
    // The form checks the reason with retireSchema first; the server checks it again and names the field.
    mutationFn: (reason: string) => api.post(labPath(labId, `/standards/${encodeURIComponent(id)}/retire`), { reason }, { schema: standardSchema }),
    onSuccess: (standard) => {
      client.setQueryData(standardKeys.detail(labId, id), standard);
      void client.invalidateQueries({ queryKey: standardKeys.lab(labId) });
      // Reviews and reports show the standard's status too.
      void client.invalidateQueries({ queryKey: ['reviews', labId] });
      void client.invalidateQueries({ queryKey: ['reports', labId] });
    },
  });
}

/** Re-runs the standard's evidence on today's engine; the server answers when every run is done. */
export function useReverifyStandard(labId: string, id: string) {
  return useMutation({
    mutationFn: () => api.post(labPath(labId, `/standards/${encodeURIComponent(id)}/reverify`), {}, { schema: reverifySchema }),
  });
}
