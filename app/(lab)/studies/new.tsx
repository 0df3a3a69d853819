import { StartStudyScreen } from '@/shared/ui/screens/studies/start-study-screen';

export default function StartStudyRoute() {
  return <StartStudyScreen />;
}
