/**
 * Upload a CSV: time data (choose its columns and a recipe, get H1/H2/Hv) or an external FRF
 * (choose the scenario whose exact FRF scores it). Fields are checked with the server's schemas.
 */
import * as DocumentPicker from 'expo-document-picker';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { frfFieldsSchema, timeDataFieldsSchema, type UploadFields } from '@/shared/api/work';
import { errorText } from '@/shared/ui/api/client';
import { recipesApi } from '@/shared/ui/api/recipes';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { useUpload } from '@/shared/ui/api/uploads';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { ChoiceChips, FieldError, SelectField } from '../kit/choice-field';
import { guessColumn, readHeader } from './csv-header';

type Kind = 'time-data' | 'frf';
type Picked = { file: Blob; name: string; columns: string[] };

export function UploadForm({ labId }: { labId: string }) {
  const router = useRouter();
  const upload = useUpload(labId);
  const recipes = recipesApi.useAll(labId);
  const scenarios = scenariosApi.useAll(labId);
  const [kind, setKind] = useState<Kind>('time-data');
  const [picked, setPicked] = useState<Picked | null>(null);
  const [cols, setCols] = useState({ input: '', output: '', time: '' });
  const [recipeId, setRecipeId] = useState('');
  const [scenarioId, setScenarioId] = useState('');
  const [sampleRate, setSampleRate] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  const pick = async () => {
    setProblem(null);
    const answer = await DocumentPicker.getDocumentAsync({ type: ['text/csv', 'text/plain', 'text/comma-separated-values', '.csv'], copyToCacheDirectory: false });
    const asset = answer.canceled ? undefined : answer.assets[0];
    if (!asset?.file) return;
    const columns = await readHeader(asset.file);
    setPicked({ file: asset.file, name: asset.name, columns });
    setCols({ input: guessColumn(columns, 'input', 1) ?? '', output: guessColumn(columns, 'output', 2) ?? '', time: guessColumn(columns, 'time_s', 0) ?? '' });
  };

  const send = () => {
    if (!picked) return setProblem('Choose a CSV file first');
    const parsed =
      kind === 'time-data'
        ? timeDataFieldsSchema.safeParse({ kind, recipeId, inputColumn: cols.input, outputColumn: cols.output, timeColumn: cols.time, sampleRateHz: sampleRate.trim() || undefined })
        : frfFieldsSchema.safeParse({ kind, scenarioId });
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const field = String(issue?.path[0] ?? '');
      const words: Record<string, string> = { recipeId: 'Choose a recipe', scenarioId: 'Choose a scenario', sampleRateHz: 'The sample rate must be a positive number, Hz' };
      return setProblem(words[field] ?? issue?.message ?? 'Check the fields');
    }
    setProblem(null);
    upload.mutate({ file: picked.file, fileName: picked.name, fields: parsed.data as UploadFields }, { onSuccess: (r) => router.push(`/uploads/${r.upload.id}`) });
  };

  const columnOptions = (picked?.columns ?? []).map((c) => ({ value: c, label: c }));
  return (
    <View style={styles.form} testID="upload-form">
      <ChoiceChips label="What the file holds" value={kind} onChange={setKind} options={[{ value: 'time-data', label: 'Time data to process' }, { value: 'frf', label: 'An FRF to score' }]} />
      <AppText variant="small" tone="muted">
        {kind === 'time-data'
          ? 'Columns for time (s), force (N) and response; the recipe processes them into H1, H2 and Hv with coherence.'
          : 'Columns frequency_hz with h_re and h_im, or magnitude_db and phase_deg; it is scored against the scenario’s exact FRF at the file’s lines.'}
      </AppText>
      <View style={styles.row}>
        <Button label={picked ? 'Choose another file' : 'Choose a CSV file'} variant="secondary" compact onPress={() => void pick()} testID="pick-file" />
        {picked ? <AppText variant="number">{`${picked.name} · ${picked.columns.length} columns`}</AppText> : null}
      </View>
      {kind === 'time-data' ? (
        <>
          {picked ? (
            <>
              <SelectField label="Time column (s)" value={cols.time || undefined} options={columnOptions} onChange={(time) => setCols((c) => ({ ...c, time }))} />
              <SelectField label="Force column (input)" value={cols.input || undefined} options={columnOptions} onChange={(input) => setCols((c) => ({ ...c, input }))} />
              <SelectField label="Response column (output)" value={cols.output || undefined} options={columnOptions} onChange={(output) => setCols((c) => ({ ...c, output }))} />
            </>
          ) : null}
          <SelectField label="Recipe" placeholder="Choose a recipe…" value={recipeId || undefined} options={(recipes.data?.items ?? []).map((r) => ({ value: r.id, label: `${r.name} (v${r.latestVersion})` }))} onChange={setRecipeId} />
          <TextField label="Sample rate, Hz (optional)" hint="Leave empty to take it from the time column's step." value={sampleRate} onChangeText={setSampleRate} inputMode="decimal" />
        </>
      ) : (
        <SelectField label="Scenario" placeholder="Choose a scenario…" value={scenarioId || undefined} options={(scenarios.data?.items ?? []).map((s) => ({ value: s.id, label: s.name }))} onChange={setScenarioId} />
      )}
      <FieldError error={problem ?? undefined} />
      {upload.isError ? <AppText variant="body" tone="fail" role="alert" testID="upload-error">{errorText(upload.error)}</AppText> : null}
      <Button label={kind === 'time-data' ? 'Upload and process' : 'Upload and score'} busy={upload.isPending} busyLabel="Uploading…" onPress={send} testID="upload-submit" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space.md }, row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md } });
