import { Slot } from 'expo-router';
import { LabGate } from '@/shared/ui/navigation/route-gates';

/** The signed-in shell (side rail or tab bar); see LabGate for who may enter. */
export default function LabLayout() {
  return (
    <LabGate>
      <Slot />
    </LabGate>
  );
}
