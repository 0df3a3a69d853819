import { MoreScreen } from '@/shared/ui/screens/more/more-screen';

export default function MoreRoute() {
  return <MoreScreen />;
}
