/** /studies/new: the start form, once the lab's recipes and scenarios are in. */
import { recipesApi } from '@/shared/ui/api/recipes';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { EmptyState } from '@/shared/ui/components';
import { useCurrentLab } from '@/shared/ui/lab-context';
import { PageHead, TextLink } from '../kit/panel';
import { ErrorBox, LoadingRow } from '../kit/query-view';
import { Column } from '../kit/two-pane';
import { StartStudyForm } from './start-study-form';

export function StartStudyScreen() {
  const lab = useCurrentLab();
  const labId = lab?.labId ?? '';
  const recipes = recipesApi.useAll(labId);
  const scenarios = scenariosApi.useAll(labId);
  let body;
  if (lab && lab.role !== 'analyst') {
    body = <EmptyState title="Not for your role" body="Only analysts start studies. You can read every study and its results." testID="role-refused" />;
  } else if (recipes.isError || scenarios.isError) {
    body = <ErrorBox error={recipes.error ?? scenarios.error} onRetry={() => { void recipes.refetch(); void scenarios.refetch(); }} />;
  } else if (!recipes.data || !scenarios.data) {
    body = <LoadingRow label="Loading recipes and scenarios…" />;
  } else if (recipes.data.items.length === 0 || scenarios.data.items.length === 0) {
    body = <EmptyState title="Nothing to run yet" body="A study needs at least one recipe and one scenario. Define them under Recipes and Scenarios first." testID="empty-state" />;
  } else {
    body = <StartStudyForm labId={labId} recipes={recipes.data.items} scenarios={scenarios.data.items} />;
  }
  return (
    <Column title="Start a study">
      <PageHead title="Start a study" eyebrow="Studies" intro="Run one recipe against a suite of scenarios over many seeds. It runs in the background; you can leave this page." actions={<TextLink href="/studies">Back to the studies</TextLink>} />
      {body}
    </Column>
  );
}
