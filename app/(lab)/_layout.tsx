import { Redirect, Slot, usePathname } from 'expo-router';
import { useSession } from '@/shared/ui/api/use-session';
import { LabShell } from '@/shared/ui/navigation/lab-shell';
import { PublicFrame } from '@/shared/ui/navigation/public-frame';
import { publicPaths, signInHref } from '@/shared/ui/navigation/session-gate';

/** The signed-in shell. Signed-out visitors may read the public pages; others go to sign in. */
export default function LabLayout() {
  const session = useSession();
  const pathname = usePathname();
  if (session.status === 'signed-in') {
    return (
      <LabShell me={session.me} pathname={pathname}>
        <Slot />
      </LabShell>
    );
  }
  if (publicPaths.includes(pathname)) {
    return (
      <PublicFrame>
        <Slot />
      </PublicFrame>
    );
  }
  return <Redirect href={signInHref(pathname)} />;
}
