import { StyleSheet, View } from 'react-native';
import { useSession } from '@/shared/ui/api/use-session';
import { AppText, EmptyState, Screen } from '@/shared/ui/components';
import { areaById } from '@/shared/ui/navigation/areas';
import { colors, space, stroke } from '@/shared/ui/theme';

const steps = [
  { title: 'Pick a known-answer system', body: 'A model of the structure you are about to test, with its exact FRF.' },
  { title: 'Describe the test conditions', body: 'Excitation, noise on either channel, delay, leakage and the rest.' },
  { title: 'Run your recipe against them', body: 'Block length, window, averages and estimator, over many seeds.' },
  { title: 'Send the evidence for sign-off', body: 'An independent reviewer approves it or sends it back.' },
];

function firstName(displayName: string) {
  return displayName.trim().split(/\s+/)[0] ?? displayName;
}

/** Home: a welcome, and what will gather here once work starts. */
export function BenchScreen() {
  const session = useSession();
  const bench = areaById('bench');
  const name = session.status === 'signed-in' ? firstName(session.me.user.displayName) : '';
  return (
    <Screen title="Bench" eyebrow={name ? `Welcome, ${name}` : 'Welcome'} intro={bench.purpose}>
      <EmptyState title={bench.emptyTitle} body={bench.emptyBody} testID="empty-state" />
      <View style={styles.steps}>
        <AppText variant="heading" role="heading" aria-level={2}>
          How a check goes
        </AppText>
        {steps.map((step, index) => (
          <View key={step.title} style={styles.step}>
            <AppText variant="number" tone="muted" style={styles.stepNumber}>
              {String(index + 1).padStart(2, '0')}
            </AppText>
            <View style={styles.stepText}>
              <AppText variant="bodyStrong">{step.title}</AppText>
              <AppText variant="small" tone="muted">
                {step.body}
              </AppText>
            </View>
          </View>
        ))}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  steps: { gap: space.md },
  step: {
    flexDirection: 'row',
    gap: space.md,
    paddingLeft: space.md,
    borderLeftWidth: stroke.rule,
    borderLeftColor: colors.borderStrong,
  },
  stepNumber: { width: space.xl, textAlign: 'right' },
  stepText: { flex: 1 },
});
