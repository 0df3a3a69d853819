/**
 * Studies of the current lab: list, one study with its progress, its results, start and cancel,
 * and live progress (server-sent events on the web, polling where EventSource is missing or the
 * stream fails). The recipes and scenarios a study is started from are read through their own
 * modules (recipes.ts, scenarios.ts), so each is cached once.
 */
import { keepPreviousData, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import {
  startStudySchema,
  studyEventSchema,
  studyListSchema,
  studyResultsSchema,
  studySchema,
  type StartStudyRequest,
  type Study,
  type StudyStatus,
} from '@/shared/api/work';
import { studyPreflightSchema } from '@/shared/api/preflight';
import { api } from './client';
import { labPath } from './labs';

export const studyKeys = {
  all: ['studies'] as const,
  lab: (labId: string) => [...studyKeys.all, labId] as const,
  list: (labId: string, filter: { status?: StudyStatus; limit?: number } = {}) => [...studyKeys.lab(labId), 'list', filter] as const,
  detail: (labId: string, id: string) => [...studyKeys.lab(labId), 'detail', id] as const,
  results: (labId: string, id: string) => [...studyKeys.lab(labId), 'results', id] as const,
  preflight: (labId: string, recipeId: string, scenarioIds: string[]) => [...studyKeys.lab(labId), 'preflight', recipeId, ...scenarioIds] as const,
};

export const isActive = (status: StudyStatus | undefined) => status === 'queued' || status === 'running';

export function useStudies(labId: string, filter: { status?: StudyStatus; limit?: number } = {}) {
  return useQuery({
    queryKey: studyKeys.list(labId, filter),
    queryFn: ({ signal }) => {
      const q = new URLSearchParams({ limit: String(filter.limit ?? 50) });
      if (filter.status) q.set('status', filter.status);
      return api.get(labPath(labId, `/studies?${q}`), { schema: studyListSchema, signal });
    },
    enabled: labId !== '',
    placeholderData: keepPreviousData,
  });
}

export function useStudy(labId: string, id: string, options: { poll?: boolean } = {}) {
  return useQuery({
    queryKey: studyKeys.detail(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/studies/${encodeURIComponent(id)}`), { schema: studySchema, signal }),
    enabled: labId !== '' && id !== '',
    refetchInterval: (query) => (options.poll && isActive(query.state.data?.status) ? 1500 : false),
  });
}

export function useStudyResults(labId: string, id: string, enabled = true) {
  return useQuery({
    queryKey: studyKeys.results(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/studies/${encodeURIComponent(id)}/results`), { schema: studyResultsSchema, signal }),
    enabled: enabled && labId !== '' && id !== '',
    staleTime: 5 * 60_000,
  });
}

function afterStudyChange(client: QueryClient, labId: string, study: Study) {
  client.setQueryData(studyKeys.detail(labId, study.id), study);
  void client.invalidateQueries({ queryKey: [...studyKeys.lab(labId), 'list'] });
}

export function useStartStudy(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (request: StartStudyRequest) => api.post(labPath(labId, '/studies'), startStudySchema.parse(request), { schema: studySchema }),
    onSuccess: (study) => afterStudyChange(client, labId, study),
  });
}

/** The live pre-flight check of a recipe (latest version) on the ticked scenarios; nothing is stored. */
export function useStudyPreflight(labId: string, recipeId: string, scenarioIds: string[]) {
  return useQuery({
    queryKey: studyKeys.preflight(labId, recipeId, scenarioIds),
    queryFn: ({ signal }) =>
      api.post(labPath(labId, '/studies/preflight'), { recipe: { id: recipeId }, scenarios: scenarioIds.map((id) => ({ id })) }, { schema: studyPreflightSchema, signal }),
    enabled: labId !== '' && recipeId !== '' && scenarioIds.length > 0,
    placeholderData: keepPreviousData,
  });
}

export function useCancelStudy(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post(labPath(labId, `/studies/${encodeURIComponent(id)}/cancel`), undefined, { schema: studySchema }),
    onSuccess: (study) => afterStudyChange(client, labId, study),
  });
}

export type LiveMode = 'idle' | 'stream' | 'polling';

/**
 * One study, kept fresh while it runs: an EventSource on /events writes each `progress` into the
 * study's cached detail, and `end` refetches the study, its results and the lists. Without
 * EventSource, or once the stream errs, the study is polled instead (mode 'polling').
 */
export function useLiveStudy(labId: string, id: string): { study: ReturnType<typeof useStudy>; mode: LiveMode } {
  const client = useQueryClient();
  const [failed, setFailed] = useState(false);
  const canStream = typeof EventSource !== 'undefined' && !failed;
  // Polls only while the study is active (useStudy's refetchInterval looks at its status).
  const study = useStudy(labId, id, { poll: !canStream });
  const active = isActive(study.data?.status);
  useEffect(() => {
    if (!active || !canStream || !labId || !id) return;
    const source = new EventSource(labPath(labId, `/studies/${encodeURIComponent(id)}/events`), { withCredentials: true });
    const onEvent = (raw: MessageEvent) => {
      const parsed = studyEventSchema.safeParse(JSON.parse(String(raw.data)));
      if (!parsed.success) return;
      const event = parsed.data;
      client.setQueryData<Study>(studyKeys.detail(labId, id), (old) => (old ? { ...old, status: event.progress.status, progress: event.progress } : old));
      if (event.type === 'end') {
        source.close();
        void client.invalidateQueries({ queryKey: studyKeys.detail(labId, id) });
        void client.invalidateQueries({ queryKey: studyKeys.results(labId, id) });
        void client.invalidateQueries({ queryKey: [...studyKeys.lab(labId), 'list'] });
      }
    };
    source.addEventListener('progress', onEvent as EventListener);
    source.addEventListener('end', onEvent as EventListener);
    source.onerror = () => {
      source.close();
      setFailed(true);
    };
    return () => source.close();
  }, [active, canStream, client, id, labId]);
  return { study, mode: !active ? 'idle' : canStream ? 'stream' : 'polling' };
}

/** CSV exports of a study (served as attachments by the API). */
export const studyCsvLinks = (labId: string, id: string) => ({
  results: labPath(labId, `/studies/${encodeURIComponent(id)}/results.csv`),
  criteria: labPath(labId, `/studies/${encodeURIComponent(id)}/criteria.csv`),
});
