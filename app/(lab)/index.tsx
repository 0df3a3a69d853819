import { HomeScreen } from '@/shared/ui/screens/home/home-screen';

export default function BenchRoute() {
  return <HomeScreen />;
}
