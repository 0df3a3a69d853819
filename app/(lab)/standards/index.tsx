import { StandardsScreen } from '@/shared/ui/screens/standards/standards-screen';

export default function StandardsRoute() {
  return <StandardsScreen />;
}
