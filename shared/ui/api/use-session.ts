/** The signed-in session: who is signed in, to which labs, and the sign-in/out actions. */
import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { meResponseSchema, sessionResponseSchema, type MeResponse, type SignInRequest } from '@/shared/api/auth';
import { api, isApiStatus } from './client';

export const sessionKeys = {
  all: ['session'] as const,
  me: () => [...sessionKeys.all, 'me'] as const,
};

/** GET /api/v1/auth/session. `null` means signed out. */
export async function fetchMe(signal?: AbortSignal): Promise<MeResponse | null> {
  const answer = await api.get('/api/v1/auth/session', { schema: sessionResponseSchema, signal });
  return answer.me;
}

export function useMe() {
  return useQuery({
    queryKey: sessionKeys.me(),
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 60_000,
    // One quick retry: the first screen waits on this answer.
    retry: 1,
    // After a failure, screens mounting below the gate must not start the check over (that
    // would put the session back to loading and unmount them again); "Try again" refetches.
    retryOnMount: false,
  });
}

export type SessionState =
  | { status: 'loading' }
  | { status: 'signed-in'; me: MeResponse }
  | { status: 'signed-out' }
  /** The server did not answer (or answered with a failure): nobody is known to be signed in. */
  | { status: 'unreachable'; error: unknown; retry: () => void };

/** The session as one of four explicit states, for gates and headers. */
export function useSession(): SessionState {
  const me = useMe();
  if (me.data) return { status: 'signed-in', me: me.data };
  if (me.data === null) return { status: 'signed-out' };
  if (me.isError) return { status: 'unreachable', error: me.error, retry: () => void me.refetch() };
  return { status: 'loading' };
}

/** Forgets everything cached for the previous user, then records who is signed in now. */
function replaceSession(queryClient: QueryClient, me: MeResponse | null) {
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
  queryClient.setQueryData(sessionKeys.me(), me);
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: SignInRequest) =>
      api.post('/api/v1/auth/sign-in', request, {
        schema: meResponseSchema,
        messages: { 401: 'E-mail or password is not right' },
      }),
    onSuccess: (me) => replaceSession(queryClient, me),
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<unknown>('/api/v1/auth/sign-out'),
    onSuccess: () => replaceSession(queryClient, null),
    // A 401 here means the session had already ended: the user is signed out either way.
    onError: (err) => {
      if (isApiStatus(err, 401)) replaceSession(queryClient, null);
    },
  });
}
