import { Slot } from 'expo-router';
import { AuthGate } from '@/shared/ui/navigation/route-gates';

export default function AuthLayout() {
  return (
    <AuthGate>
      <Slot />
    </AuthGate>
  );
}
