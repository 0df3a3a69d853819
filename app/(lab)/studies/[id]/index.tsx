import { useLocalSearchParams } from 'expo-router';
import { StudiesScreen } from '@/shared/ui/screens/studies/studies-screen';

export default function StudyRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <StudiesScreen studyId={String(id)} />;
}
