import { useLocalSearchParams } from 'expo-router';
import { ScenariosScreen } from '@/shared/ui/screens/scenarios/scenarios-screen';

/** /scenarios/new and /scenarios/:id — the editor (beside the list on a wide screen). */
export default function ScenarioRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <ScenariosScreen id={typeof id === 'string' ? id : undefined} />;
}
