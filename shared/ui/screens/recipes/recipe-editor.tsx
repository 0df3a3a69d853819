/**
 * The recipe editor: name and description, processing settings with the window's figures shown
 * live, acceptance criteria, the engine's advice for a scenario, saving as a new version, and the
 * version history with the differences between any two versions field by field.
 */
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { parseRecipe, type Recipe } from '@/shared/engine/recipe';
import { recipesApi, type RecipeRecord } from '@/shared/ui/api/recipes';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { QueryView } from '@/shared/ui/screens/kit/query-view';
import { EditorHead } from '@/shared/ui/screens/systems/editor-head';
import { engineCheckedResolver } from '@/shared/ui/screens/systems/form-rules';
import { SaveBar } from '@/shared/ui/screens/systems/save-bar';
import { TextInputField } from '@/shared/ui/screens/systems/text-input-field';
import { VersionHistory } from '@/shared/ui/screens/systems/version-history';
import { space } from '@/shared/ui/theme';
import { RecipeAdvice } from './recipe-advice';
import { RecipeFields } from './recipe-fields';
import { recipeFormSchema, startingRecipe, type RecipeFormValues } from './recipe-form-values';
import { WindowFigures } from './window-figures';
import { useVersionedSave } from '@/shared/ui/screens/systems/use-versioned-save';

interface EditorProps {
  labId: string;
  id: string;
  canWrite: boolean;
}

export function RecipeEditor({ labId, id, canWrite }: EditorProps) {
  const isNew = id === 'new';
  const latest = recipesApi.useLatest(labId, isNew ? '' : id);
  if (isNew) return <RecipeForm labId={labId} record={null} canWrite={canWrite} />;
  return (
    <QueryView query={latest} loadingLabel="Loading the recipe…">
      {(record) => <RecipeForm key={record.id} labId={labId} record={record} canWrite={canWrite} />}
    </QueryView>
  );
}

const resolver = engineCheckedResolver<RecipeFormValues>(recipeFormSchema, (d) => parseRecipe(d));

function valuesOf(record: RecipeRecord | null): RecipeFormValues {
  return { note: '', definition: record ? record.definition : startingRecipe() };
}

function RecipeForm({ labId, record, canWrite }: { labId: string; record: RecipeRecord | null; canWrite: boolean }) {
  const form = useForm<RecipeFormValues>({ resolver, defaultValues: valuesOf(record) });
  const { control, setValue, getValues, handleSubmit, reset } = form;
  const { save, mutation, savedVersion, versions, useVersion } = useVersionedSave(recipesApi, labId, record, '/recipes', (saved) => reset(valuesOf(saved)));
  const definition = useWatch({ control, name: 'definition' }) as Recipe;

  const onSave = handleSubmit((values) => {
    const body = { note: values.note ?? '', description: values.definition.description ?? '', definition: values.definition as Recipe };
    save(body);
  });
  return (
    <FormProvider {...form}>
      <View style={styles.editor} testID="recipe-editor">
        <EditorHead title={record ? record.name : 'New recipe'} eyebrow={record ? `Recipe · version ${record.latestVersion}` : 'Recipe · not saved yet'} />
        <Panel title="About">
          <TextInputField control={control} name="definition.name" label="Name" placeholder="e.g. Frame survey, Hann 50 %" />
          <TextInputField control={control} name="definition.description" label="Description" multiline />
        </Panel>
        <RecipeFields />
        <WindowFigures window={definition.window} blockLength={definition.blockLength} params={definition.windowParams} />
        <RecipeAdvice
          labId={labId}
          recipe={definition}
          canWrite={canWrite}
          onUse={(settings) => setValue('definition', { ...(getValues('definition') as Recipe), ...settings }, { shouldDirty: true })}
        />
        <SaveBar
          isNew={!record}
          canWrite={canWrite}
          busy={mutation.isPending}
          error={mutation.error}
          savedVersion={savedVersion}
          noun="recipe"
          onSave={() => void onSave()}
          noteField={<TextInputField control={control} name="note" label="What this version changes" />}
        />
        {record ? (
          <VersionHistory dirty={form.formState.isDirty} versions={versions} useVersion={useVersion} onLoad={(_, d) => setValue('definition', d as Recipe, { shouldDirty: true })} />
        ) : null}
      </View>
    </FormProvider>
  );
}

const styles = StyleSheet.create({ editor: { gap: space.xl } });
