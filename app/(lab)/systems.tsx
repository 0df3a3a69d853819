import { SystemsScreen } from '@/shared/ui/screens/systems/systems-screen';

export default function SystemsRoute() {
  return <SystemsScreen />;
}
