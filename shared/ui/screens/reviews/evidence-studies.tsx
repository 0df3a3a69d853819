/** The studies of a submission's evidence: each scenario's criteria and which passed. */
import { StyleSheet, View } from 'react-native';
import type { Evidence } from '@/shared/api/approval';
import { AppText } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { Panel, TextLink } from '../kit/panel';
import { Verdict } from '../kit/verdict';
import { CriteriaList } from '../studies/scenario-facts';

export function EvidenceStudies({ evidence }: { evidence: Evidence }) {
  return (
    <View style={styles.wrap} testID="evidence-studies">
      {evidence.studies.map((study) => (
        <Panel key={study.id} title={study.name} aside={<Verdict pass={study.pass} />}>
          <AppText variant="small" tone="muted">{`${study.seeds} seeds per scenario · base seed ${study.baseSeed} · engine ${study.engineVersion}`}</AppText>
          {study.scenarios.map((s) => (
            <View key={s.id} style={styles.scenario}>
              <View style={styles.row}>
                <AppText variant="bodyStrong" style={styles.flex}>{`${s.name} (v${s.version})`}</AppText>
                <Verdict pass={s.pass} />
              </View>
              <CriteriaList criteria={s.criteria} />
              {s.warnings.map((w) => (
                <AppText key={w.message} variant="small" tone="muted">{`Warning: ${w.message} (${w.runs} runs)`}</AppText>
              ))}
            </View>
          ))}
          <View style={styles.links}>
            <TextLink href={`/studies/${study.id}`}>Open the study and its plots</TextLink>
            <TextLink href={`/reports/study/${study.id}`}>Report</TextLink>
          </View>
        </Panel>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  scenario: { gap: space.xs, paddingTop: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.borderStrong },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  flex: { flex: 1 },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
