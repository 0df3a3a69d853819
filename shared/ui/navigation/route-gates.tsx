import { Redirect, useGlobalSearchParams, usePathname } from 'expo-router';
import { useRef, type ReactNode } from 'react';
import { useSession } from '@/shared/ui/api/use-session';
import { LabShell } from './lab-shell';
import { PublicFrame } from './public-frame';
import { publicPaths, safeNextPath, SessionSplash, signInHref } from './session-gate';

/**
 * Gate of the (lab) group: signed-in users get the shell; signed-out visitors may read the
 * public pages; everyone else goes to sign in, with the path they asked for as `next`.
 */
export function LabGate({ children }: { children: ReactNode }) {
  const session = useSession();
  const pathname = usePathname();
  // While the redirect runs the router passes through "/", and a second redirect would drop
  // `next`; so the target is fixed when the gate first closes.
  const target = useRef<string | null>(null);
  if (session.status === 'signed-in') {
    target.current = null;
    return (
      <LabShell me={session.me} pathname={pathname}>
        {children}
      </LabShell>
    );
  }
  if (session.status === 'loading' && target.current === null) return <SessionSplash />;
  if (target.current === null && publicPaths.includes(pathname)) {
    return <PublicFrame>{children}</PublicFrame>;
  }
  target.current ??= signInHref(pathname);
  return <Redirect href={target.current} />;
}

/** Gate of the (auth) group: a signed-in user is sent on, to `next` when it is an app path. */
export function AuthGate({ children }: { children: ReactNode }) {
  const session = useSession();
  const { next } = useGlobalSearchParams<{ next?: string }>();
  if (session.status === 'signed-in') return <Redirect href={safeNextPath(next)} />;
  return <>{children}</>;
}
