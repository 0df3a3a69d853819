import { useLocalSearchParams } from 'expo-router';
import { UploadsScreen } from '@/shared/ui/screens/uploads/uploads-screen';

export default function UploadRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <UploadsScreen uploadId={String(id)} />;
}
