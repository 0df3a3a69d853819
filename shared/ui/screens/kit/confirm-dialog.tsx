/**
 * A dialog that asks before something is done: what will happen, optional fields, and two
 * buttons. Used for every destructive or signing action.
 */
import type { ReactNode } from 'react';
import { Modal, ScrollView, StyleSheet, View } from 'react-native';
import { errorText } from '@/shared/ui/api/client';
import { AppText, Button } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

type ConfirmDialogProps = {
  visible: boolean;
  title: string;
  body?: string;
  confirmLabel: string;
  busyLabel?: string;
  cancelLabel?: string;
  busy?: boolean;
  /** The failure of the last attempt, shown in the dialog. */
  error?: unknown;
  onConfirm: () => void;
  onCancel: () => void;
  children?: ReactNode;
  testID?: string;
};

export function ConfirmDialog({
  visible,
  title,
  body,
  confirmLabel,
  busyLabel,
  cancelLabel = 'Cancel',
  busy,
  error,
  onConfirm,
  onCancel,
  children,
  testID,
}: ConfirmDialogProps) {
  return (
    <Modal visible={visible} transparent animationType="none" onRequestClose={onCancel}>
      <View style={styles.backdrop}>
        <View style={styles.dialog} role="dialog" aria-modal aria-label={title} testID={testID ?? 'confirm-dialog'}>
          <ScrollView contentContainerStyle={styles.content}>
            <AppText variant="heading" role="heading" aria-level={2}>
              {title}
            </AppText>
            {body ? <AppText variant="body">{body}</AppText> : null}
            {children}
            {error ? (
              <AppText variant="small" tone="fail" role="alert" testID="dialog-error">
                {errorText(error)}
              </AppText>
            ) : null}
            <View style={styles.buttons}>
              <Button label={cancelLabel} variant="secondary" onPress={onCancel} disabled={busy} />
              <Button label={confirmLabel} onPress={onConfirm} busy={busy} busyLabel={busyLabel} testID="dialog-confirm" />
            </View>
          </ScrollView>
        </View>
      </View>
    </Modal>
  );
}

const styles = StyleSheet.create({
  backdrop: { flex: 1, backgroundColor: 'rgba(17, 27, 38, 0.45)', alignItems: 'center', justifyContent: 'center', padding: space.lg },
  dialog: {
    width: '100%',
    maxWidth: layout.formMaxWidth + 80,
    maxHeight: '90%',
    backgroundColor: colors.surface,
    borderRadius: radius.md,
    borderTopWidth: stroke.plumb,
    borderTopColor: colors.plumbLine,
  },
  content: { gap: space.lg, padding: space.xl },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'flex-end', gap: space.sm },
});
