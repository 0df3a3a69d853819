import { UploadsScreen } from '@/shared/ui/screens/uploads/uploads-screen';

export default function UploadsRoute() {
  return <UploadsScreen />;
}
