/** Systems: the lab's known-answer systems and the editor of the chosen one. */
import { systemsApi } from '@/shared/ui/api/systems';
import { SystemEditor } from './system-editor';
import { VersionedResourceScreen } from './versioned-resource-screen';

export function SystemsScreen({ id }: { id?: string }) {
  return (
    <VersionedResourceScreen
      id={id}
      area="systems"
      noun="system"
      useList={systemsApi.useList}
      Editor={SystemEditor}
      chooseBody="Pick one from the list to see its exact FRF and modes, or make a new one."
    />
  );
}
