import { AboutScreen } from '@/shared/ui/screens/about/about-screen';

export default function AboutRoute() {
  return <AboutScreen />;
}
