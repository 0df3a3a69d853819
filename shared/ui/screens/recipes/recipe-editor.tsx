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
import { EditorHead } from '@/shared/ui/screens/systems/editor-head';
import { engineCheckedResolver } from '@/shared/ui/screens/systems/form-rules';
import { TextInputField } from '@/shared/ui/screens/systems/text-input-field';
import { space } from '@/shared/ui/theme';
import { RecipeAdvice } from './recipe-advice';
import { RecipeFields } from './recipe-fields';
import { recipeFormSchema, startingRecipe, type RecipeFormValues } from './recipe-form-values';
import { WindowFigures } from './window-figures';
import { useVersionedSave } from '@/shared/ui/screens/systems/use-versioned-save';
import { VersionedEditorFooter, VersionedEditorLoader, type EditorProps } from '@/shared/ui/screens/systems/versioned-editor-parts';

export function RecipeEditor({ labId, id, canWrite }: EditorProps) {
  const latest = recipesApi.useLatest(labId, id === 'new' ? '' : id);
  return (
    <VersionedEditorLoader id={id} noun="recipe" query={latest}>
      {(record) => <RecipeForm key={record?.id ?? 'new'} labId={labId} record={record} canWrite={canWrite} />}
    </VersionedEditorLoader>
  );
}

const resolver = engineCheckedResolver(recipeFormSchema, (d) => parseRecipe(d));

function valuesOf(record: RecipeRecord | null): RecipeFormValues {
  return { note: '', definition: record ? record.definition : startingRecipe() };
}

function RecipeForm({ labId, record, canWrite }: { labId: string; record: RecipeRecord | null; canWrite: boolean }) {
  const form = useForm<RecipeFormValues>({ resolver, defaultValues: valuesOf(record) });
  const { control, setValue, getValues, handleSubmit, reset } = form;
  const saver = useVersionedSave(recipesApi, labId, record, '/recipes', (saved) => reset(valuesOf(saved)));
  const definition = useWatch({ control, name: 'definition' }) as Recipe;

  const onSave = handleSubmit((values) => {
    const body = { note: values.note ?? '', description: values.definition.description ?? '', definition: values.definition as Recipe };
    saver.save(body);
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
        <VersionedEditorFooter
          saver={saver}
          isNew={!record}
          canWrite={canWrite}
          noun="recipe"
          dirty={form.formState.isDirty}
          onSave={() => void onSave()}
          onLoad={(d) => setValue('definition', d as Recipe, { shouldDirty: true })}
          noteField={<TextInputField control={control} name="note" label="What this version changes" />}
        />
      </View>
    </FormProvider>
  );
}

const styles = StyleSheet.create({ editor: { gap: space.xl } });
