import { BenchScreen } from '@/shared/ui/screens/bench/bench-screen';

export default function BenchRoute() {
  return <BenchScreen />;
}
