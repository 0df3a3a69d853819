/** A recorded decision: who, what it means, when, and the hashes that tie it to the evidence. */
import { View, StyleSheet } from 'react-native';
import type { Submission } from '@/shared/api/approval';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { FactRow, formatDateTime } from '../kit/figure';
import { Panel } from '../kit/panel';

export function DecisionRecord({ decision: d, standardId }: { decision: NonNullable<Submission['decision']>; standardId: string | null }) {
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
        <FactRow label="Engine" text={d.engineVersion} />
        <AppText variant="label" tone="muted" selectable>{`evidence sha256 ${d.evidenceSha256}`}</AppText>
        <AppText variant="label" tone="muted" selectable>{`signature sha256 ${d.signatureSha256}`}</AppText>
        {standardId ? <AppText variant="small" tone="muted">It is now a standard of the lab.</AppText> : null}
      </View>
    </Panel>
  );
}

const styles = StyleSheet.create({ list: { gap: space.xs } });
