import { useLocalSearchParams } from 'expo-router';
import { StandardsScreen } from '@/shared/ui/screens/standards/standards-screen';

export default function StandardRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <StandardsScreen standardId={String(id)} />;
}
