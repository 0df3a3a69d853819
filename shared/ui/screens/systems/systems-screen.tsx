/**
 * Systems: the list of the lab's known-answer systems and, beside it on a wide screen (instead of
 * it on a phone), the editor of the chosen one or of a new one.
 */
import { useState } from 'react';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { systemsApi } from '@/shared/ui/api/systems';
import { EmptyState } from '@/shared/ui/components';
import { areaById } from '@/shared/ui/navigation/areas';
import { TwoPane } from '@/shared/ui/screens/kit/two-pane';
import { TextLink } from '@/shared/ui/screens/kit/panel';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { ResourceList } from './resource-list';
import { SystemEditor } from './system-editor';
import { canBuild } from './text-input-field';

export function SystemsScreen({ id }: { id?: string }) {
  const labId = useLabId();
  const canWrite = canBuild(useLabRole());
  const wide = useWideLayout();
  const [search, setSearch] = useState('');
  const [offset, setOffset] = useState(0);
  const query = systemsApi.useList(labId, { q: search, offset });
  const area = areaById('systems');
  const list = (
    <ResourceList
      title="Systems"
      eyebrow={area.group}
      intro={area.purpose}
      noun="system"
      basePath="/systems"
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
      {!wide ? <TextLink href="/systems">← All systems</TextLink> : null}
      <SystemEditor labId={labId} id={id} canWrite={canWrite} />
    </>
  ) : wide ? (
    <EmptyState title="Choose a system" body="Pick one from the list to see its exact FRF and modes, or make a new one." testID="choose-state" />
  ) : undefined;
  return <TwoPane title={id === 'new' ? 'New system' : 'Systems'} list={list} detail={detail} />;
}
