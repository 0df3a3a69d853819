/** Review submissions of the current lab: the inbox, one submission, its evidence, the decision. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { decideSchema, evidenceSchema, recipeLifecycleSchema, reviewListSchema, submissionSchema, submitReviewSchema, type DecideRequest, type SubmitReviewRequest } from '@/shared/api/approval';
import { api } from './client';
import { labPath } from './labs';

export type ReviewFilter = { status?: 'pending' | 'approved' | 'returned'; limit?: number };

export const reviewKeys = {
  all: ['reviews'] as const,
  lab: (labId: string) => [...reviewKeys.all, labId] as const,
  list: (labId: string, filter: ReviewFilter = {}) => [...reviewKeys.lab(labId), 'list', filter] as const,
  detail: (labId: string, id: string) => [...reviewKeys.lab(labId), 'detail', id] as const,
  evidence: (labId: string, id: string) => [...reviewKeys.lab(labId), 'evidence', id] as const,
  lifecycle: (labId: string, recipeId: string) => [...reviewKeys.lab(labId), 'lifecycle', recipeId] as const,
};

const reviewPath = (labId: string, id = '') => labPath(labId, `/reviews${id ? `/${encodeURIComponent(id)}` : ''}`);

export function useReviews(labId: string, filter: ReviewFilter = {}) {
  return useQuery({
    queryKey: reviewKeys.list(labId, filter),
    queryFn: ({ signal }) => {
      const q = new URLSearchParams({ limit: String(filter.limit ?? 50) });
      if (filter.status) q.set('status', filter.status);
      return api.get(`${reviewPath(labId)}?${q}`, { schema: reviewListSchema, signal });
    },
    enabled: labId !== '',
  });
}

export function useSubmission(labId: string, id: string) {
  return useQuery({
    queryKey: reviewKeys.detail(labId, id),
    queryFn: ({ signal }) => api.get(reviewPath(labId, id), { schema: submissionSchema, signal }),
    enabled: labId !== '' && id !== '',
  });
}

export function useEvidence(labId: string, id: string) {
  return useQuery({
    queryKey: reviewKeys.evidence(labId, id),
    queryFn: ({ signal }) => api.get(`${reviewPath(labId, id)}/evidence`, { schema: evidenceSchema, signal }),
    enabled: labId !== '' && id !== '',
  });
}

/** Approve (signed with the reviewer's password) or return. A 401/403 keeps the dialog open. */
export function useDecide(labId: string, id: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (request: DecideRequest) =>
      api.post(`${reviewPath(labId, id)}/decision`, decideSchema.parse(request), {
        schema: submissionSchema,
        messages: { 401: 'The password is not right; the decision was not recorded.' },
      }),
    onSuccess: (submission) => {
      client.setQueryData(reviewKeys.detail(labId, id), submission);
      void client.invalidateQueries({ queryKey: reviewKeys.lab(labId) });
      void client.invalidateQueries({ queryKey: ['standards', labId] });
    },
  });
}

/** Puts a recipe version with its evidence studies forward for review; answers the new submission. */
export function useSubmitForReview(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (request: SubmitReviewRequest) => api.post(reviewPath(labId), submitReviewSchema.parse(request), { schema: submissionSchema }),
    onSuccess: (submission) => {
      client.setQueryData(reviewKeys.detail(labId, submission.id), submission);
      void client.invalidateQueries({ queryKey: reviewKeys.lab(labId) });
    },
  });
}

/** Every version of a recipe with its review state, newest submission and the standard it became. */
export function useRecipeLifecycle(labId: string, recipeId: string) {
  return useQuery({
    queryKey: reviewKeys.lifecycle(labId, recipeId),
    queryFn: ({ signal }) => api.get(labPath(labId, `/recipes/${encodeURIComponent(recipeId)}/lifecycle`), { schema: recipeLifecycleSchema, signal }),
    enabled: labId !== '' && recipeId !== '',
  });
}
