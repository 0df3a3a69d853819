import { useLocalSearchParams } from 'expo-router';
import { ScenarioResultScreen } from '@/shared/ui/screens/studies/scenario-result-screen';

export default function ScenarioResultRoute() {
  const { id, position } = useLocalSearchParams<{ id: string; position: string }>();
  return <ScenarioResultScreen studyId={String(id)} position={Number(position)} />;
}
