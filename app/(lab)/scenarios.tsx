import { ScenariosScreen } from '@/shared/ui/screens/scenarios/scenarios-screen';

export default function ScenariosRoute() {
  return <ScenariosScreen />;
}
