/**
 * The save block of an editor: a note that says what the version changes, the one primary action,
 * and what happened (saved as vN, or the server's refusal in words).
 */
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { errorText } from '@/shared/ui/api/client';
import { AppText, Button } from '@/shared/ui/components';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { space } from '@/shared/ui/theme';

interface SaveBarProps {
  isNew: boolean;
  canWrite: boolean;
  busy: boolean;
  error: unknown;
  savedVersion: number | null;
  noteField: ReactNode;
  onSave: () => void;
  /** e.g. "system" */
  noun: string;
}

export function SaveBar({ isNew, canWrite, busy, error, savedVersion, noteField, onSave, noun }: SaveBarProps) {
  if (!canWrite) {
    return (
      <Panel title="Saving">
        <AppText variant="body">{`Your role in this lab reads ${noun}s but does not change them; an analyst saves new versions.`}</AppText>
      </Panel>
    );
  }
  return (
    <Panel title={isNew ? `Save the new ${noun}` : 'Save a new version'} testID="save-bar">
      {noteField}
      <View style={styles.row}>
        <Button label={isNew ? `Save ${noun}` : 'Save version'} busy={busy} busyLabel="Saving…" onPress={onSave} testID="save-button" />
        {savedVersion !== null && !busy && !error ? (
          <AppText variant="small" tone="pass" role="status" testID="saved-status">{`✓ Saved as version ${savedVersion}`}</AppText>
        ) : null}
      </View>
      {error ? (
        <AppText variant="small" tone="fail" role="alert" testID="save-error">
          {`Not saved: ${errorText(error)}`}
        </AppText>
      ) : null}
    </Panel>
  );
}

const styles = StyleSheet.create({ row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md } });
