/** Recipes: the lab's processing recipes and, beside them or instead of them on a phone, the editor. */
import { useState } from 'react';
import { recipesApi } from '@/shared/ui/api/recipes';
import { EmptyState } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { TextLink } from '@/shared/ui/screens/kit/panel';
import { TwoPane } from '@/shared/ui/screens/kit/two-pane';
import { ResourceList } from '@/shared/ui/screens/systems/resource-list';
import { canBuild } from '@/shared/ui/screens/systems/text-input-field';
import { RecipeEditor } from './recipe-editor';

export function RecipesScreen({ id }: { id?: string }) {
  const labId = useLabId();
  const canWrite = canBuild(useLabRole());
  const wide = useWideLayout();
  const [search, setSearch] = useState('');
  const [offset, setOffset] = useState(0);
  const query = recipesApi.useList(labId, { q: search, offset });
  const area = areaById('recipes');
  const list = (
    <ResourceList
      title="Recipes"
      eyebrow={area.group}
      intro={area.purpose}
      noun="recipe"
      basePath="/recipes"
      query={query}
      search={search}
      onSearch={setSearch}
      offset={offset}
      onOffset={setOffset}
      activeId={id}
      canWrite={canWrite}
      empty={{ title: area.emptyTitle, body: area.emptyBody }}
    />
  );
  const detail = id ? (
    <>
      {!wide ? <TextLink href="/recipes">← All recipes</TextLink> : null}
      <RecipeEditor labId={labId} id={id} canWrite={canWrite} />
    </>
  ) : wide ? (
    <EmptyState title="Choose a recipe" body="Pick one to see its settings, window figures and history, or make a new one." testID="choose-state" />
  ) : undefined;
  return <TwoPane title={id === 'new' ? 'New recipe' : 'Recipes'} list={list} detail={detail} />;
}
