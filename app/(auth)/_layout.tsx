import { Redirect, Slot, useLocalSearchParams } from 'expo-router';
import { useSession } from '@/shared/ui/api/use-session';
import { safeNextPath } from '@/shared/ui/navigation/session-gate';

/** Signed-in users have nothing to do here: send them on (to `next` when it is an app path). */
export default function AuthLayout() {
  const session = useSession();
  const { next } = useLocalSearchParams<{ next?: string }>();
  if (session.status === 'signed-in') return <Redirect href={safeNextPath(next)} />;
  return <Slot />;
}
