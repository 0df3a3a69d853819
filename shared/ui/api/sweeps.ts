/**
 * Sweeps of the current lab: list, one sweep with its progress (polled while it runs), its judged
 * points, start, and "make this a recipe" (through the recipes API: a new recipe from a point).
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { sweepListSchema, sweepResultsSchema, sweepSchema, type StartSweepRequest } from '@/shared/api/sweeps';
import type { Recipe } from '@/shared/engine/recipe';
import { api } from './client';
import { labPath } from './labs';
import { recipesApi } from './recipes';
import { isActive } from './studies';

export const sweepKeys = {
  all: ['sweeps'] as const,
  list: (labId: string) => [...sweepKeys.all, labId, 'list'] as const,
  detail: (labId: string, id: string) => [...sweepKeys.all, labId, 'detail', id] as const,
  results: (labId: string, id: string) => [...sweepKeys.all, labId, 'results', id] as const,
};

export function useSweeps(labId: string) {
  return useQuery({
    queryKey: sweepKeys.list(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/sweeps'), { schema: sweepListSchema, signal }),
    enabled: labId !== '',
  });
}

export function useSweep(labId: string, id: string) {
  return useQuery({
    queryKey: sweepKeys.detail(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/sweeps/${encodeURIComponent(id)}`), { schema: sweepSchema, signal }),
    enabled: labId !== '' && id !== '',
    refetchInterval: (query) => (isActive(query.state.data?.status) ? 1000 : false),
  });
}

export function useSweepResults(labId: string, id: string, enabled: boolean) {
  return useQuery({
    queryKey: sweepKeys.results(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/sweeps/${encodeURIComponent(id)}/results`), { schema: sweepResultsSchema, signal }),
    enabled: enabled && labId !== '' && id !== '',
  });
}

export function useStartSweep(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: StartSweepRequest) => api.post(labPath(labId, '/sweeps'), body, { schema: sweepSchema }),
    onSuccess: () => client.invalidateQueries({ queryKey: sweepKeys.list(labId) }),
  });
}

/** Saves a grid point's recipe as a new recipe of the lab (version 1), under `name`. */
export function useMakeRecipe(labId: string) {
  const create = recipesApi.useCreate(labId);
  return {
    ...create,
    make: (recipe: Record<string, unknown>, name: string, note: string) =>
      create.mutateAsync({ name, note, definition: { ...(recipe as Recipe), name } }),
  };
}
