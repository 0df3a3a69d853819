/** Validation reports: the content of the printable page, and the PDF links. */
import { useQuery } from '@tanstack/react-query';
import { reportSchema } from '@/shared/api/approval';
import { api } from './client';
import { labPath } from './labs';

export type ReportKind = 'study' | 'standard';

export const reportKeys = {
  all: ['reports'] as const,
  one: (labId: string, kind: ReportKind, id: string) => [...reportKeys.all, labId, kind, id] as const,
};

export function reportPaths(labId: string, kind: ReportKind, id: string) {
  const target = encodeURIComponent(id);
  return kind === 'study'
    ? { content: labPath(labId, `/reports/study/${target}`), pdf: labPath(labId, `/reports/study/${target}.pdf`) }
    : { content: labPath(labId, `/standards/${target}/report`), pdf: labPath(labId, `/standards/${target}/report.pdf`) };
}

export function useReport(labId: string, kind: ReportKind, id: string) {
  return useQuery({
    queryKey: reportKeys.one(labId, kind, id),
    queryFn: ({ signal }) => api.get(reportPaths(labId, kind, id).content, { schema: reportSchema, signal }),
    enabled: labId !== '' && id !== '',
    staleTime: 5 * 60_000,
  });
}
