/** The current lab's audit trail: filtered pages, the hash-chain check, and the CSV export. */
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { auditListSchema, auditVerifySchema } from '@/shared/api/people';
import { api } from './client';
import { labPath } from './labs';

export type AuditFilter = { action?: string; actor?: string; from?: string; to?: string; limit?: number; offset?: number };

export const auditKeys = {
  all: ['audit'] as const,
  list: (labId: string, filter: AuditFilter) => [...auditKeys.all, labId, 'list', filter] as const,
  verify: (labId: string) => [...auditKeys.all, labId, 'verify'] as const,
};

export function auditQueryString(filter: AuditFilter): string {
  const q = new URLSearchParams({ limit: String(filter.limit ?? 25), offset: String(filter.offset ?? 0) });
  for (const key of ['action', 'actor', 'from', 'to'] as const) {
    const value = filter[key]?.trim();
    if (value) q.set(key, value);
  }
  return q.toString();
}

export function useAuditTrail(labId: string, filter: AuditFilter) {
  return useQuery({
    queryKey: auditKeys.list(labId, filter),
    queryFn: ({ signal }) => api.get(labPath(labId, `/audit?${auditQueryString(filter)}`), { schema: auditListSchema, signal }),
    enabled: labId !== '',
    placeholderData: keepPreviousData,
  });
}

/** Recomputes the whole chain on the server; run on demand and when the screen opens. */
export function useAuditVerify(labId: string) {
  return useQuery({
    queryKey: auditKeys.verify(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/audit/verify'), { schema: auditVerifySchema, signal }),
    enabled: labId !== '',
    staleTime: 0,
  });
}

export const auditExportPath = (labId: string) => labPath(labId, '/audit/export');
