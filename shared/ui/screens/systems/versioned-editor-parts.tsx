/**
 * The parts every versioned-resource editor (system, scenario, recipe) shares: loading the record
 * before the form opens, and the footer with the save bar and the version history.
 */
import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { QueryView } from '@/shared/ui/screens/kit/query-view';
import { SaveBar } from './save-bar';
import type { useVersionedSave } from './use-versioned-save';
import { VersionHistory } from './version-history';

export interface EditorProps {
  labId: string;
  id: string;
  canWrite: boolean;
}

/** Opens the form at once for `/new`, or once the latest version has loaded. */
export function VersionedEditorLoader<R extends { id: string }>(props: {
  id: string;
  noun: string;
  query: UseQueryResult<R>;
  children: (record: R | null) => ReactNode;
}) {
  if (props.id === 'new') return <>{props.children(null)}</>;
  return (
    <QueryView query={props.query} loadingLabel={`Loading the ${props.noun}…`}>
      {(record) => props.children(record)}
    </QueryView>
  );
}

export function VersionedEditorFooter<D>(props: {
  saver: ReturnType<typeof useVersionedSave<D>>;
  isNew: boolean;
  canWrite: boolean;
  noun: string;
  noteField: ReactNode;
  dirty: boolean;
  onSave: () => void;
  onLoad: (definition: unknown) => void;
}) {
  const { saver } = props;
  return (
    <>
      <SaveBar
        isNew={props.isNew}
        canWrite={props.canWrite}
        busy={saver.mutation.isPending}
        error={saver.mutation.error}
        savedVersion={saver.savedVersion}
        noun={props.noun}
        onSave={props.onSave}
        noteField={props.noteField}
      />
      {props.isNew ? null : (
        <VersionHistory dirty={props.dirty} versions={saver.versions} useVersion={saver.useVersion} onLoad={(_, d) => props.onLoad(d)} />
      )}
    </>
  );
}
