import { StudiesScreen } from '@/shared/ui/screens/studies/studies-screen';

export default function StudiesRoute() {
  return <StudiesScreen />;
}
