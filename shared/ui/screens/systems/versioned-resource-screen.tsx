/**
 * The screen shape shared by systems, scenarios and recipes: the lab's paged, searchable list and,
 * beside it on a wide screen (instead of it on a phone), the editor of the chosen one or a new one.
 */
import { useState, type ComponentType } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { EmptyState } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { areaById, type AreaId } from '@/shared/ui/navigation/areas';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { TextLink } from '@/shared/ui/screens/kit/panel';
import { TwoPane } from '@/shared/ui/screens/kit/two-pane';
import type { ResourceList as ResourceListData } from '@/shared/api/work';
import { ResourceList } from './resource-list';
import { canBuild } from './text-input-field';

export interface VersionedResourceScreenProps {
  id?: string;
  area: AreaId;
  /** Singular noun in lower case ("system"). */
  noun: string;
  useList: (labId: string, filter: { q: string; offset: number }) => UseQueryResult<ResourceListData>;
  Editor: ComponentType<{ labId: string; id: string; canWrite: boolean }>;
  /** What the wide screen's empty detail pane says. */
  chooseBody: string;
}

export function VersionedResourceScreen({ id, area: areaId, noun, useList, Editor, chooseBody }: VersionedResourceScreenProps) {
  const labId = useLabId();
  const canWrite = canBuild(useLabRole());
  const wide = useWideLayout();
  const [search, setSearch] = useState('');
  const [offset, setOffset] = useState(0);
  const query = useList(labId, { q: search, offset });
  const area = areaById(areaId);
  const list = (
    <ResourceList
      title={area.label}
      eyebrow={area.group}
      intro={area.purpose}
      noun={noun}
      basePath={area.href}
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
      {!wide ? <TextLink href={area.href}>{`← All ${noun}s`}</TextLink> : null}
      <Editor labId={labId} id={id} canWrite={canWrite} />
    </>
  ) : wide ? (
    <EmptyState title={`Choose a ${noun}`} body={chooseBody} testID="choose-state" />
  ) : undefined;
  return <TwoPane title={id === 'new' ? `New ${noun}` : area.label} list={list} detail={detail} />;
}
