/**
 * The system editor: name and description, the kind (SDOF, modes, or masses with springs and
 * dampers) and its fields, the FRF quantity; the exact FRF and mode facts update live; saving
 * makes version 1 or a new version; the version history shows what changed.
 */
import { useRef } from 'react';
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { parseSystemSpec } from '@/shared/engine/systems';
import type { SystemSpec } from '@/shared/engine/systems/schema';
import { systemsApi, type SystemRecord } from '@/shared/ui/api/systems';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { space } from '@/shared/ui/theme';
import { EditorHead } from './editor-head';
import { engineCheckedResolver } from './form-rules';
import { ModalFields } from './modal-fields';
import { PhysicalFields } from './physical-fields';
import { SdofFields } from './sdof-fields';
import { kindOptions, quantityOptions, startingDefinition, systemFormSchema, type SystemFormValues, type SystemKind } from './system-form-values';
import { SystemLive } from './system-live';
import { TextInputField } from './text-input-field';
import { useVersionedSave } from './use-versioned-save';
import { VersionedEditorFooter, VersionedEditorLoader, type EditorProps } from './versioned-editor-parts';

export function SystemEditor({ labId, id, canWrite }: EditorProps) {
  const latest = systemsApi.useLatest(labId, id === 'new' ? '' : id);
  return (
    <VersionedEditorLoader id={id} noun="system" query={latest}>
      {(record) => <SystemForm key={record?.id ?? 'new'} labId={labId} record={record} canWrite={canWrite} />}
    </VersionedEditorLoader>
  );
}

const resolver = engineCheckedResolver(systemFormSchema, (d) => parseSystemSpec(d), 'system');

function valuesOf(record: SystemRecord | null): SystemFormValues {
  if (!record) return { name: '', description: '', note: '', definition: startingDefinition('sdof') };
  return { name: record.name, description: record.description, note: '', definition: record.definition };
}

function SystemForm({ labId, record, canWrite }: { labId: string; record: SystemRecord | null; canWrite: boolean }) {
  const form = useForm<SystemFormValues>({ resolver, defaultValues: valuesOf(record) });
  const { control, getValues, setValue, handleSubmit, reset } = form;
  const saver = useVersionedSave(systemsApi, labId, record, '/systems', (saved) => reset({ ...valuesOf(saved), note: '' }));
  const kind = useWatch({ control, name: 'definition.kind' }) as SystemKind;
  const quantity = useWatch({ control, name: 'definition.quantity' });
  // Switching kind keeps what was typed for the other kinds, so switching back restores it.
  const stash = useRef<Partial<Record<SystemKind, SystemSpec>>>({});

  const switchKind = (next: SystemKind) => {
    if (next === kind) return;
    const current = getValues('definition') as SystemSpec;
    stash.current[kind] = current;
    const restored = stash.current[next];
    setValue('definition', restored ? { ...restored, quantity: current.quantity } : startingDefinition(next, current.quantity), { shouldDirty: true });
  };
  const onSave = handleSubmit((values) => {
    const body = { name: values.name, description: values.description ?? '', note: values.note ?? '', definition: values.definition as SystemSpec };
    saver.save(body);
  });
  const title = record ? record.name : 'New system';
  return (
    <FormProvider {...form}>
      <View style={styles.editor} testID="system-editor">
        <EditorHead title={title} eyebrow={record ? `System · version ${record.latestVersion}` : 'System · not saved yet'} />
        <Panel title="Definition">
          <TextInputField control={control} name="name" label="Name" placeholder="e.g. Drone motor arm, first bending" />
          <TextInputField control={control} name="description" label="Description" multiline />
          <ChoiceChips label="Model" options={kindOptions} value={kind} onChange={switchKind} />
          <ChoiceChips
            label="Output quantity"
            options={quantityOptions}
            value={quantity}
            onChange={(q) => setValue('definition.quantity', q, { shouldDirty: true })}
          />
          {kind === 'sdof' ? <SdofFields /> : kind === 'modal' ? <ModalFields /> : <PhysicalFields />}
        </Panel>
        <SystemLive />
        <VersionedEditorFooter
          saver={saver}
          isNew={!record}
          canWrite={canWrite}
          noun="system"
          dirty={form.formState.isDirty}
          onSave={() => void onSave()}
          onLoad={(d) => setValue('definition', d as SystemSpec, { shouldDirty: true })}
          noteField={<TextInputField control={control} name="note" label="What this version changes" placeholder="e.g. damping from the latest tap test" />}
        />
      </View>
    </FormProvider>
  );
}

const styles = StyleSheet.create({ editor: { gap: space.xl } });
