/**
 * React-query hooks for the lab's versioned resources (systems, scenarios, recipes): a paged and
 * searchable list, the latest version, the version list, one version, create and update (a new
 * version from a base version; 409 when someone saved first). One factory, three resources.
 */
import { keepPreviousData, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { resourceListSchema, versionListSchema, type ResourceList, type ResourceSummary, type VersionInfo } from '@/shared/api/work';
import { api, apiRequest } from './client';
import { labPath } from './labs';

export type ResourceKind = 'systems' | 'scenarios' | 'recipes';

/** One version of a resource with its definition, as GET answers it. */
export type ResourceVersionOf<D> = ResourceSummary & { version: VersionInfo; definition: D };

export interface ListFilter {
  q?: string;
  offset?: number;
  limit?: number;
}

export interface SaveRequest<D> {
  name?: string;
  description?: string;
  note?: string;
  definition: D;
}

export const PAGE_SIZE = 20;

export function resourceKeys(kind: ResourceKind) {
  const all = [kind] as const;
  return {
    all,
    lab: (labId: string) => [...all, labId] as const,
    list: (labId: string, filter: ListFilter) => [...all, labId, 'list', filter] as const,
    latest: (labId: string, id: string) => [...all, labId, 'latest', id] as const,
    versions: (labId: string, id: string) => [...all, labId, 'versions', id] as const,
    version: (labId: string, id: string, version: number) => [...all, labId, 'version', id, version] as const,
  };
}

export function listPath(labId: string, kind: ResourceKind, filter: ListFilter): string {
  const q = new URLSearchParams({ limit: String(filter.limit ?? PAGE_SIZE), offset: String(filter.offset ?? 0), sort: 'updatedAt', order: 'desc' });
  if (filter.q?.trim()) q.set('q', filter.q.trim());
  return labPath(labId, `/${kind}?${q}`);
}

/** D: the definition as stored and answered; I: the definition as a save request sends it (the schema's input). */
export function createResourceHooks<D, I = D>(kind: ResourceKind, versionSchema: z.ZodType<ResourceVersionOf<D>>) {
  const keys = resourceKeys(kind);
  const itemPath = (labId: string, id: string, rest = '') => labPath(labId, `/${kind}/${encodeURIComponent(id)}${rest}`);

  function afterSave(client: QueryClient, labId: string, saved: ResourceVersionOf<D>) {
    client.setQueryData(keys.latest(labId, saved.id), saved);
    client.setQueryData(keys.version(labId, saved.id, saved.version.version), saved);
    void client.invalidateQueries({ queryKey: [...keys.lab(labId), 'list'] });
    void client.invalidateQueries({ queryKey: keys.versions(labId, saved.id) });
    // The study form lists recipes and scenarios under its own keys.
    void client.invalidateQueries({ queryKey: ['study-inputs', labId] });
  }

  /** The latest version, for callers that fetch on demand (client.fetchQuery with keys.latest). */
  const fetchLatest = (labId: string, id: string, signal?: AbortSignal) => api.get(itemPath(labId, id), { schema: versionSchema, signal });

  return {
    keys,
    fetchLatest,
    useList(labId: string, filter: ListFilter) {
      return useQuery<ResourceList>({
        queryKey: keys.list(labId, filter),
        queryFn: ({ signal }) => api.get(listPath(labId, kind, filter), { schema: resourceListSchema, signal }),
        enabled: labId !== '',
        placeholderData: keepPreviousData,
      });
    },
    useLatest(labId: string, id: string) {
      return useQuery({
        queryKey: keys.latest(labId, id),
        queryFn: ({ signal }) => api.get(itemPath(labId, id), { schema: versionSchema, signal }),
        enabled: labId !== '' && id !== '',
      });
    },
    useVersions(labId: string, id: string) {
      return useQuery<VersionInfo[]>({
        queryKey: keys.versions(labId, id),
        queryFn: async ({ signal }) => (await api.get(itemPath(labId, id, '/versions'), { schema: versionListSchema, signal })).items,
        enabled: labId !== '' && id !== '',
      });
    },
    useVersion(labId: string, id: string, version: number | null) {
      return useQuery({
        queryKey: keys.version(labId, id, version ?? 0),
        queryFn: ({ signal }) => api.get(itemPath(labId, id, `/versions/${version}`), { schema: versionSchema, signal }),
        enabled: labId !== '' && id !== '' && version !== null && version > 0,
        staleTime: Infinity, // a stored version never changes
      });
    },
    useCreate(labId: string) {
      const client = useQueryClient();
      return useMutation({
        mutationFn: (body: SaveRequest<I>) => api.post(labPath(labId, `/${kind}`), body, { schema: versionSchema }),
        onSuccess: (saved) => afterSave(client, labId, saved),
      });
    },
    useUpdate(labId: string, id: string) {
      const client = useQueryClient();
      return useMutation({
        mutationFn: (body: SaveRequest<I> & { baseVersion: number }) =>
          apiRequest(itemPath(labId, id), {
            method: 'PUT',
            body,
            schema: versionSchema,
            messages: { 409: 'Someone saved a newer version while you were editing. Reload it, then make your change again.' },
          }),
        onSuccess: (saved) => afterSave(client, labId, saved),
      });
    },
  };
}
