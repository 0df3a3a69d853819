/** Scenarios: the lab's list and, beside it or instead of it on a phone, the editor. */
import { useState } from 'react';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { EmptyState } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { TextLink } from '@/shared/ui/screens/kit/panel';
import { TwoPane } from '@/shared/ui/screens/kit/two-pane';
import { ResourceList } from '@/shared/ui/screens/systems/resource-list';
import { canBuild } from '@/shared/ui/screens/systems/text-input-field';
import { ScenarioEditor } from './scenario-editor';

export function ScenariosScreen({ id }: { id?: string }) {
  const labId = useLabId();
  const canWrite = canBuild(useLabRole());
  const wide = useWideLayout();
  const [search, setSearch] = useState('');
  const [offset, setOffset] = useState(0);
  const query = scenariosApi.useList(labId, { q: search, offset });
  const area = areaById('scenarios');
  const list = (
    <ResourceList
      title="Scenarios"
      eyebrow={area.group}
      intro={area.purpose}
      noun="scenario"
      basePath="/scenarios"
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
      {!wide ? <TextLink href="/scenarios">← All scenarios</TextLink> : null}
      <ScenarioEditor labId={labId} id={id} canWrite={canWrite} />
    </>
  ) : wide ? (
    <EmptyState title="Choose a scenario" body="Pick one to see its signals and exact FRF, or make a new one from one of the lab's systems." testID="choose-state" />
  ) : undefined;
  return <TwoPane title={id === 'new' ? 'New scenario' : 'Scenarios'} list={list} detail={detail} />;
}
