/**
 * The lab's name and the footer printed on its validation reports, for admins. Only changed fields
 * are sent; both the form and the server check them with the same schema, and a field the server
 * refuses shows its message under that field.
 */
import { useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { updateLabRequestSchema, type Lab, type UpdateLabRequest } from '@/shared/api/people';
import { ApiRequestError, errorText } from '@/shared/ui/api/client';
import { useLabSettings, useUpdateLab } from '@/shared/ui/api/labs';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { Panel } from '../kit/panel';
import { QueryView } from '../kit/query-view';

type Field = 'name' | 'reportFooter';
type Errors = Partial<Record<Field | 'form', string>>;

const fieldOf = (path: string): Field | 'form' => (path === 'name' || path === 'reportFooter' ? path : 'form');

/** The server's schema failure carries details.fields: [{ path, message }]. */
function serverErrors(error: unknown): Errors {
  if (!(error instanceof ApiRequestError)) return {};
  const fields = (error.details as { fields?: { path: string; message: string }[] } | undefined)?.fields;
  const found: Errors = {};
  for (const f of Array.isArray(fields) ? fields : []) found[fieldOf(f.path)] ??= f.message;
  return found;
}

export function LabSettingsPanel({ labId }: { labId: string }) {
  const lab = useLabSettings(labId);
  return (
    <Panel title="Lab settings" testID="lab-settings">
      <QueryView query={lab} loadingLabel="Loading the lab's settings…">{(l) => <SettingsForm labId={labId} lab={l} />}</QueryView>
    </Panel>
  );
}

function SettingsForm({ labId, lab }: { labId: string; lab: Lab }) {
  const update = useUpdateLab(labId);
  const [name, setName] = useState(lab.name);
  const [footer, setFooter] = useState(lab.reportFooter);
  const [errors, setErrors] = useState<Errors>({});
  useEffect(() => {
    setName(lab.name);
    setFooter(lab.reportFooter);
  }, [lab.name, lab.reportFooter]);

  const edit = (apply: () => void) => {
    apply();
    setErrors({});
    if (update.isError || update.isSuccess) update.reset();
  };

  const save = () => {
    const patch: Partial<UpdateLabRequest> = {};
    if (name !== lab.name) patch.name = name;
    if (footer !== lab.reportFooter) patch.reportFooter = footer;
    const parsed = updateLabRequestSchema.safeParse(patch);
    if (!parsed.success) {
      const found: Errors = {};
      for (const issue of parsed.error.issues) found[fieldOf(issue.path.map(String).join('.'))] ??= issue.message;
      return setErrors(found);
    }
    update.mutate(parsed.data, { onError: (error) => setErrors(serverErrors(error)) });
  };

  return (
    <View style={styles.form}>
      <TextField label="Lab name" value={name} onChangeText={(t) => edit(() => setName(t))} error={errors.name} testID="lab-name" />
      <TextField
        label="Report footer"
        hint="Printed at the foot of every validation report of the lab."
        value={footer}
        onChangeText={(t) => edit(() => setFooter(t))}
        error={errors.reportFooter}
        multiline
        testID="lab-footer"
      />
      {errors.form ? <AppText variant="body" tone="fail" role="alert" testID="lab-settings-problem">{errors.form}</AppText> : null}
      {update.isError && !errors.name && !errors.reportFooter && !errors.form ? (
        <AppText variant="body" tone="fail" role="alert" testID="lab-settings-problem">{errorText(update.error)}</AppText>
      ) : null}
      {update.isSuccess ? <AppText variant="body" tone="pass" role="status" testID="lab-settings-saved">Settings saved.</AppText> : null}
      <AppText variant="small" tone="muted">{lab.updatedAt ? `Last changed ${formatDateTime(lab.updatedAt)}` : 'Not changed since the lab was created'}</AppText>
      <View style={styles.actions}>
        <Button label="Save the settings" busy={update.isPending} busyLabel="Saving…" onPress={save} testID="lab-settings-save" />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  actions: { flexDirection: 'row' },
});
