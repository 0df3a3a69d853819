/**
 * Which lab the signed-in person is working in. People in several labs switch in the header; the
 * choice is kept in localStorage on the web (memory elsewhere) and read by every lab-scoped hook
 * through `useCurrentLab()`. The store sits behind a React context so tests (or a future native
 * shell) can give their own; the default store needs no provider.
 */
import { createContext, useContext, useSyncExternalStore } from 'react';
import type { Membership, Role } from '@/shared/api/auth';
import { useSession } from './api/use-session';

export const LAB_STORAGE_KEY = 'plumbline.selectedLab';

export type LabStore = {
  get(): string | null;
  set(labId: string): void;
  subscribe(listener: () => void): () => void;
};

function storage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

/** A store over localStorage (when there is one) with a memory fallback. */
export function createLabStore(): LabStore {
  let memory: string | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => storage()?.getItem(LAB_STORAGE_KEY) ?? memory,
    set: (labId) => {
      memory = labId;
      storage()?.setItem(LAB_STORAGE_KEY, labId);
      listeners.forEach((l) => l());
    },
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

const LabStoreContext = createContext<LabStore>(createLabStore());

export type CurrentLab = Membership & { memberships: Membership[]; select: (labId: string) => void };

/** The lab chosen (or the first membership when the stored choice is not one of them). */
export function pickMembership(memberships: readonly Membership[], stored: string | null): Membership | undefined {
  return memberships.find((m) => m.labId === stored) ?? memberships[0];
}

/** The current lab of the signed-in user, or null (signed out, or in no lab). */
export function useCurrentLab(): CurrentLab | null {
  const store = useContext(LabStoreContext);
  const stored = useSyncExternalStore(store.subscribe, store.get, store.get);
  const session = useSession();
  if (session.status !== 'signed-in') return null;
  const { memberships } = session.me;
  const current = pickMembership(memberships, stored);
  if (!current) return null;
  return { ...current, memberships, select: store.set };
}

/** The current lab's id ('' when there is none: lab queries stay disabled). */
export function useLabId(): string {
  return useCurrentLab()?.labId ?? '';
}

export function useLabRole(): Role | null {
  return useCurrentLab()?.role ?? null;
}

export const roleWords: Record<Role, string> = { admin: 'Lab admin', analyst: 'Analyst', reviewer: 'Reviewer', auditor: 'Auditor' };
