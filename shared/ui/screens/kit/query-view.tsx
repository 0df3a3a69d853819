/**
 * Maps a react-query result to the four view states every screen shows: loading, error (with a
 * way to try again), empty, and ready.
 */
import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { errorText } from '@/shared/ui/api/client';
import { AppText, Button, EmptyState } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';

export type ViewState = 'loading' | 'error' | 'empty' | 'ready';

/** The view state of a query, given a test for "nothing to show". */
export function viewStateOf<T>(query: Pick<UseQueryResult<T>, 'data' | 'isError' | 'isPending'>, isEmpty?: (data: T) => boolean): ViewState {
  if (query.data !== undefined) return isEmpty?.(query.data) ? 'empty' : 'ready';
  if (query.isError) return 'error';
  return 'loading';
}

export function LoadingRow({ label = 'Loading…', testID }: { label?: string; testID?: string }) {
  return (
    <View style={styles.loading} aria-busy testID={testID ?? 'loading'}>
      <ActivityIndicator size="small" color={colors.textMuted} />
      <AppText variant="small" tone="muted">
        {label}
      </AppText>
    </View>
  );
}

export function ErrorBox({ error, onRetry, title = 'This could not be loaded' }: { error: unknown; onRetry?: () => void; title?: string }) {
  return (
    <View style={styles.error} role="alert" testID="error-state">
      <AppText variant="bodyStrong">{title}</AppText>
      <AppText variant="body">{errorText(error)}</AppText>
      {onRetry ? <Button label="Try again" variant="secondary" compact onPress={onRetry} /> : null}
    </View>
  );
}

type QueryViewProps<T> = {
  query: UseQueryResult<T>;
  isEmpty?: (data: T) => boolean;
  empty?: { title: string; body: string; action?: ReactNode };
  loadingLabel?: string;
  children: (data: T) => ReactNode;
};

export function QueryView<T>({ query, isEmpty, empty, loadingLabel, children }: QueryViewProps<T>) {
  const state = viewStateOf(query, isEmpty);
  if (state === 'loading') return <LoadingRow label={loadingLabel} />;
  if (state === 'error') return <ErrorBox error={query.error} onRetry={() => void query.refetch()} />;
  if (state === 'empty' && empty) return <EmptyState title={empty.title} body={empty.body} action={empty.action} testID="empty-state" />;
  return <>{children(query.data as T)}</>;
}

const styles = StyleSheet.create({
  loading: { flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingVertical: space.md },
  error: {
    gap: space.sm,
    padding: space.lg,
    borderLeftWidth: stroke.plumb,
    borderLeftColor: colors.fail,
    borderRadius: radius.sm,
    backgroundColor: colors.failTint,
    alignItems: 'flex-start',
  },
});
