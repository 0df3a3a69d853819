/**
 * A recorded decision: who, what it means, when. An approval is an electronic signature and shows
 * the hashes that tie it to the evidence; a return is not signed and shows none. The standard an
 * approval opened is named with its present status (a retired one is no longer the lab's).
 */
import { View, StyleSheet } from 'react-native';
import type { Submission } from '@/shared/api/approval';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { FactRow, formatDateTime } from '../kit/figure';
import { Panel } from '../kit/panel';

const STANDARD_WORDS = {
  active: 'It is now a standard of the lab.',
  retired: 'It became a standard of the lab and has since been retired: the lab no longer cites it as current.',
  superseded: 'It became a standard of the lab and has since been superseded by a newer version.',
} as const;

export function DecisionRecord({ decision: d, standardId, standardStatus }: Pick<Submission, 'decision' | 'standardId' | 'standardStatus'> & { decision: NonNullable<Submission['decision']> }) {
  const approved = d.decision === 'approved';
  return (
    <Panel title={approved ? 'Signed off' : 'Returned'} aside={<StatusBadge tone={approved ? 'pass' : 'warning'} label={approved ? 'Approved' : 'Returned'} />} testID="decision-record">
      <View style={styles.list}>
        <FactRow label="Reviewer" text={d.signer.displayName} />
        <FactRow label="E-mail" text={d.signer.email} />
        <FactRow label="In this lab" text={d.signer.origin.text} />
        <FactRow label="When" text={formatDateTime(d.decidedAt)} />
        {d.meaning ? <AppText variant="body">{`Meaning: ${d.meaning}`}</AppText> : null}
        {d.reason ? <AppText variant="body">{`Reason: ${d.reason}`}</AppText> : null}
        {d.comment ? <AppText variant="body">{`Comment: ${d.comment}`}</AppText> : null}
        {approved ? (
          <>
            <FactRow label="Engine" text={d.engineVersion} />
            <AppText variant="label" tone="muted" selectable>{`evidence sha256 ${d.evidenceSha256}`}</AppText>
            <AppText variant="label" tone="muted" selectable>{`signature sha256 ${d.signatureSha256}`}</AppText>
          </>
        ) : null}
        {standardId ? (
          <View style={styles.standard} testID="decision-standard">
            {standardStatus && standardStatus !== 'active' ? <StatusBadge tone="neutral" label={standardStatus === 'retired' ? 'Retired' : 'Superseded'} /> : null}
            <AppText variant="small" tone="muted" style={styles.flex}>{STANDARD_WORDS[standardStatus ?? 'active']}</AppText>
          </View>
        ) : null}
      </View>
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  standard: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  flex: { flexGrow: 1, flexBasis: 200 },
});
