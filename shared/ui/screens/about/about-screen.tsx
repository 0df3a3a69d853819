import Constants from 'expo-constants';
import { StyleSheet, View } from 'react-native';
import { AppText, Caution, productName, Screen } from '@/shared/ui/components';
import { areaById } from '@/shared/ui/navigation/areas';
import { colors, radius, space, stroke } from '@/shared/ui/theme';

/** The three cautions Plumbline always shows, in its own words. */
export const cautions = [
  {
    title: 'What a synthetic check covers',
    body: "A synthetic check verifies the processing, not the transducers, the fixture or the test set-up. It does not replace calibration, the lab's accredited procedures or engineering judgement.",
  },
  {
    title: 'Safety on the test floor',
    body: "Shaker and impact testing involve moving masses and high forces. Follow the lab's safety rules and local codes.",
  },
  {
    title: 'Who is responsible',
    body: "An approval in Plumbline records the lab's decision. Responsibility stays with the lab's licensed or authorised staff.",
  },
] as const;

export function appVersion(): string {
  return Constants.expoConfig?.version ?? 'unknown';
}

export function AboutScreen() {
  const about = areaById('about');
  return (
    <Screen title="About" eyebrow={about.group} intro={about.purpose}>
      <AppText variant="body">
        {productName} simulates systems whose FRF is known exactly, adds the error sources you choose,
        runs your lab&apos;s processing recipe on the simulated signals and scores the estimated FRFs
        against the exact one. When the evidence holds, an independent reviewer signs it off.
      </AppText>
      <View style={styles.cautions} testID="cautions">
        {cautions.map((caution) => (
          <Caution key={caution.title} title={caution.title}>
            {caution.body}
          </Caution>
        ))}
      </View>
      <View style={styles.version}>
        <AppText variant="label" tone="muted">
          Version
        </AppText>
        <AppText variant="number" testID="app-version">
          {`${productName} ${appVersion()}`}
        </AppText>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  cautions: { gap: space.md },
  version: {
    gap: space.xs,
    padding: space.lg,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
  },
});
