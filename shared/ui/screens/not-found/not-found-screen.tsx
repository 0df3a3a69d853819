import { Link } from 'expo-router';
import { StyleSheet } from 'react-native';
import { AppText, EmptyState, Screen } from '@/shared/ui/components';
import { colors } from '@/shared/ui/theme';

export function NotFoundScreen() {
  return (
    <Screen title="Page not found">
      <EmptyState
        title="Nothing hangs on this line"
        body="This address is not part of Plumbline. It may have been mistyped, or the item it pointed to may have been removed."
      />
      <Link href="/" style={styles.link}>
        <AppText variant="bodyStrong" style={styles.link}>
          Back to the bench
        </AppText>
      </Link>
    </Screen>
  );
}

const styles = StyleSheet.create({ link: { color: colors.text, textDecorationLine: 'underline' } });
