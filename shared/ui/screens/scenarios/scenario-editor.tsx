/**
 * The scenario editor: what it represents, its system (a copy of one of the lab's), acquisition,
 * excitation and error sources; the preview updates as one edits; saving makes a new version;
 * the version history shows what changed.
 */
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { OUTPUT_UNITS, parseScenario, type ScenarioInput } from '@/shared/engine/scenario';
import { scenariosApi, type ScenarioRecord } from '@/shared/ui/api/scenarios';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { EditorHead } from '@/shared/ui/screens/systems/editor-head';
import { engineCheckedResolver } from '@/shared/ui/screens/systems/form-rules';
import { NumberField } from '@/shared/ui/screens/systems/number-field';
import { TextInputField } from '@/shared/ui/screens/systems/text-input-field';
import { space } from '@/shared/ui/theme';
import { ErrorFields } from './error-fields';
import { ExcitationFields } from './excitation-fields';
import { scenarioFormSchema, startingScenario, type ScenarioFormValues } from './scenario-form-values';
import { ScenarioLive } from './scenario-live';
import { SystemPicker } from './system-picker';
import { useVersionedSave } from '@/shared/ui/screens/systems/use-versioned-save';
import { VersionedEditorFooter, VersionedEditorLoader, type EditorProps } from '@/shared/ui/screens/systems/versioned-editor-parts';

export function ScenarioEditor({ labId, id, canWrite }: EditorProps) {
  const latest = scenariosApi.useLatest(labId, id === 'new' ? '' : id);
  return (
    <VersionedEditorLoader id={id} noun="scenario" query={latest}>
      {(record) => <ScenarioForm key={record?.id ?? 'new'} labId={labId} record={record} canWrite={canWrite} />}
    </VersionedEditorLoader>
  );
}

const resolver = engineCheckedResolver(scenarioFormSchema, (d) => parseScenario(d));
const startOptions = [
  { value: 'default', label: 'As the excitation suits' },
  { value: 'steady-state', label: 'Steady state' },
  { value: 'from-rest', label: 'From rest' },
] as const;

function valuesOf(record: ScenarioRecord | null): ScenarioFormValues {
  return { note: '', definition: record ? (record.definition as ScenarioInput) : startingScenario() };
}

function ScenarioForm({ labId, record, canWrite }: { labId: string; record: ScenarioRecord | null; canWrite: boolean }) {
  const form = useForm<ScenarioFormValues>({ resolver, defaultValues: valuesOf(record) });
  const { control, setValue, handleSubmit, reset } = form;
  const saver = useVersionedSave(scenariosApi, labId, record, '/scenarios', (saved) => reset(valuesOf(saved)));
  const quantity = useWatch({ control, name: 'definition.system.quantity' }) as keyof typeof OUTPUT_UNITS;
  const start = useWatch({ control, name: 'definition.acquisition.start' });

  const onSave = handleSubmit((values) => {
    const body = { note: values.note ?? '', description: values.definition.description ?? '', definition: values.definition };
    saver.save(body);
  });
  return (
    <FormProvider {...form}>
      <View style={styles.editor} testID="scenario-editor">
        <EditorHead title={record ? record.name : 'New scenario'} eyebrow={record ? `Scenario · version ${record.latestVersion}` : 'Scenario · not saved yet'} />
        <Panel title="What it represents">
          <TextInputField control={control} name="definition.name" label="Name" placeholder="e.g. Frame, noise on the response channel" />
          <TextInputField control={control} name="definition.description" label="Description" multiline />
          <TextInputField control={control} name="definition.expectation" label="What a good recipe should show" multiline />
        </Panel>
        <Panel title="System">
          <SystemPicker labId={labId} canWrite={canWrite} />
        </Panel>
        <Panel title="Acquisition">
          <NumberField control={control} name="definition.acquisition.sampleRateHz" label="Sample rate fs" unit="Hz" />
          <NumberField control={control} name="definition.acquisition.durationS" label="Record duration" unit="s" hint="64 to 2²³ samples" />
          <ChoiceChips
            label="Record starts"
            options={startOptions}
            value={start ?? 'default'}
            onChange={(v) => setValue('definition.acquisition.start', v === 'default' ? undefined : v, { shouldDirty: true })}
          />
        </Panel>
        <Panel title="Excitation">
          <ExcitationFields />
        </Panel>
        <Panel title="Error sources">
          <ErrorFields outputUnit={OUTPUT_UNITS[quantity] ?? 'm'} />
        </Panel>
        <ScenarioLive labId={labId} saved={record ? { id: record.id, version: record.latestVersion } : null} />
        <VersionedEditorFooter
          saver={saver}
          isNew={!record}
          canWrite={canWrite}
          noun="scenario"
          dirty={form.formState.isDirty}
          onSave={() => void onSave()}
          onLoad={(d) => setValue('definition', d as ScenarioInput, { shouldDirty: true })}
          noteField={<TextInputField control={control} name="note" label="What this version changes" />}
        />
      </View>
    </FormProvider>
  );
}

const styles = StyleSheet.create({ editor: { gap: space.xl } });
