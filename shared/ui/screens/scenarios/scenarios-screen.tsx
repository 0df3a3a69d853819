/** Scenarios: the lab's scenarios and the editor of the chosen one. */
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { VersionedResourceScreen } from '@/shared/ui/screens/systems/versioned-resource-screen';
import { ScenarioEditor } from './scenario-editor';

export function ScenariosScreen({ id }: { id?: string }) {
  return (
    <VersionedResourceScreen
      id={id}
      area="scenarios"
      noun="scenario"
      useList={scenariosApi.useList}
      Editor={ScenarioEditor}
      chooseBody="Pick one to see its signals and exact FRF, or make a new one from one of the lab's systems."
    />
  );
}
