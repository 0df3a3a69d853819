import { useLocalSearchParams } from 'expo-router';
import { SystemsScreen } from '@/shared/ui/screens/systems/systems-screen';

/** /systems/new and /systems/:id — the editor (beside the list on a wide screen). */
export default function SystemRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <SystemsScreen id={typeof id === 'string' ? id : undefined} />;
}
