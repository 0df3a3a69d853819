import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { MeResponse } from '@/shared/api/auth';
import { errorText } from '@/shared/ui/api/client';
import { useSignOut } from '@/shared/ui/api/use-session';
import { AppText, Button, PlumbMark } from '@/shared/ui/components';
import { roleWords, useCurrentLab } from '@/shared/ui/lab-context';
import { SelectField } from '@/shared/ui/screens/kit/choice-field';
import { colors, layout, space, stroke } from '@/shared/ui/theme';

/** The signed-in header: which lab, who is signed in, and the way out. */
export function ShellHeader({ me, showBrand }: { me: MeResponse; showBrand: boolean }) {
  const signOut = useSignOut();
  const router = useRouter();
  const current = useCurrentLab();
  const membership = current ?? me.memberships[0];
  const several = me.memberships.length > 1 && current !== null;
  return (
    <View role="banner" style={styles.header}>
      <View style={styles.row}>
        {showBrand ? <PlumbMark height={32} /> : null}
        <View style={styles.who}>
          {several ? (
            <View style={styles.switcher} testID="lab-switcher">
              <SelectField
                label="Lab"
                value={current.labId}
                options={me.memberships.map((m) => ({ value: m.labId, label: m.labName }))}
                onChange={(labId) => {
                  current.select(labId);
                  router.replace('/');
                }}
              />
            </View>
          ) : (
            <AppText variant="label" tone="muted" numberOfLines={1} testID="header-lab">
              {membership ? membership.labName : 'No lab yet'}
            </AppText>
          )}
          <AppText variant="bodyStrong" numberOfLines={1} testID="header-user">
            {me.user.displayName}
            {membership ? (
              <AppText variant="small" tone="muted">
                {'  '}
                {roleWords[membership.role]}
              </AppText>
            ) : null}
          </AppText>
        </View>
        <Button
          label="Sign out"
          variant="secondary"
          compact
          busy={signOut.isPending}
          busyLabel="Signing out…"
          onPress={() => signOut.mutate(undefined, { onSuccess: () => router.replace('/sign-in') })}
        />
      </View>
      {signOut.isError ? (
        <AppText variant="small" tone="fail" role="alert">
          {`Sign-out did not go through: ${errorText(signOut.error)}`}
        </AppText>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  header: {
    minHeight: layout.headerHeight,
    justifyContent: 'center',
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    gap: space.xs,
    backgroundColor: colors.surface,
    borderBottomWidth: stroke.rule,
    borderBottomColor: colors.border,
  },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  who: { flex: 1, minWidth: 0 },
  switcher: { maxWidth: 320 },
});
