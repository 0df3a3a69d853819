import { LabScreen } from '@/shared/ui/screens/lab/lab-screen';

export default function LabRoute() {
  return <LabScreen />;
}
