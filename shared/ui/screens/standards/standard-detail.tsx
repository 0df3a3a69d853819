/** One standard: its recipe version, scope, dates, signature, evidence, report and retirement. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { retireSchema, type Standard } from '@/shared/api/approval';
import { reportPaths } from '@/shared/ui/api/reports';
import { useRetireStandard, useStandard } from '@/shared/ui/api/standards';
import { AppText, Button, Caution, StatusBadge, TextField } from '@/shared/ui/components';
import { useLabRole } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { FactRow, formatDate, formatDateTime } from '../kit/figure';
import { Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { SettingsSummaryPanel } from '../kit/settings-summary';
import { ScopeFacts } from '../reviews/scope-facts';
import { ReverifyPanel } from './reverify-panel';
import { retireFieldError } from './retire-reason';

export function StandardBadge({ standard }: { standard: Pick<Standard, 'status' | 'reviewDueAt'> }) {
  if (standard.status === 'retired') return <StatusBadge tone="neutral" label="Retired" />;
  if (standard.status === 'superseded') return <StatusBadge tone="neutral" label="Superseded" />;
  if (standard.reviewDueAt < Date.now()) return <StatusBadge tone="warning" label="Review overdue" />;
  return <StatusBadge tone="pass" label="Active" />;
}

export function StandardDetail({ labId, standardId }: { labId: string; standardId: string }) {
  const standard = useStandard(labId, standardId);
  return <QueryView query={standard} loadingLabel="Loading the standard…">{(s) => <StandardBody labId={labId} standard={s} />}</QueryView>;
}

function StandardBody({ labId, standard: s }: { labId: string; standard: Standard }) {
  const role = useLabRole();
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | undefined>();
  const retire = useRetireStandard(labId, s.id);
  const confirmRetire = () => {
    const parsed = retireSchema.safeParse({ reason });
    if (!parsed.success) return setReasonError(parsed.error.issues[0]?.message);
    retire.mutate(parsed.data.reason, { onSuccess: () => setAsking(false) });
  };
  const shownReasonError = reasonError ?? retireFieldError(retire.error);
  const paths = reportPaths(labId, 'standard', s.id);
  return (
    <View style={styles.body} testID="standard-detail">
      <View style={styles.head}>
        <AppText variant="label" tone="muted">Standard</AppText>
        <AppText variant="title" role="heading" aria-level={1} testID="screen-title">{`${s.recipe.name} v${s.recipe.version}`}</AppText>
        <StandardBadge standard={s} />
      </View>
      {s.status !== 'active' ? (
        <Caution title={s.status === 'retired' ? 'Retired: no longer a standard of the lab' : 'Superseded by a newer version'} testID="standard-ended">
          {`${s.status === 'retired' ? 'Retired' : 'Superseded'} ${formatDateTime(s.ended?.at)}${s.ended?.by ? ` by ${s.ended.by.displayName}` : ''}. ${s.ended?.reason ? `Reason: ${s.ended.reason}. ` : ''}Its record, evidence and signature stay for the audit trail; the lab may not cite it as current.`}
        </Caution>
      ) : null}
      <Panel title="Scope"><ScopeFacts scope={s.scope} />{s.purpose ? <AppText variant="body">{s.purpose}</AppText> : null}</Panel>
      <Panel title="Dates and versions">
        <FactRow label="Effective from" text={formatDate(s.effectiveAt)} />
        <FactRow label="Review falls due" text={formatDate(s.reviewDueAt)} />
        {s.supersedes ? <FactRow label="Supersedes" text={`recipe v${s.supersedes.recipeVersion}`} /> : null}
        {s.supersededBy ? <FactRow label="Superseded by" text={`recipe v${s.supersededBy.recipeVersion}`} /> : null}
      </Panel>
      {s.settings ? <SettingsSummaryPanel summary={s.settings} title="Settings signed off" /> : null}
      <Panel title="Signature">
        <FactRow label="Reviewer" text={`${s.signature.signer.displayName} (${s.signature.signer.email})`} />
        <FactRow label="In the lab by" text={s.signature.signer.origin.text} />
        <FactRow label="Signed" text={formatDateTime(s.signature.signedAt)} />
        <AppText variant="body">{`Meaning: ${s.signature.meaning}`}</AppText>
        {s.signature.comment ? <AppText variant="body">{`Comment: ${s.signature.comment}`}</AppText> : null}
        <AppText variant="small" tone="muted" testID="signature-rule">{s.signature.rule}</AppText>
        <AppText variant="label" tone="muted" selectable>{`evidence sha256 ${s.signature.evidenceSha256}`}</AppText>
      </Panel>
      <View style={styles.links}>
        <TextLink href={`/reports/standard/${s.id}`} testID="standard-report">Validation report</TextLink>
        <TextLink href={paths.pdf} external>PDF</TextLink>
        <TextLink href={`/reviews/${s.submissionId}`}>The review</TextLink>
        {s.evidenceStudyIds.map((id, i) => <TextLink key={id} href={`/studies/${id}`}>{`Evidence study ${i + 1}`}</TextLink>)}
      </View>
      <ReverifyPanel labId={labId} standardId={s.id} />
      {role === 'admin' && s.status === 'active' ? (
        <View style={styles.actions}><Button label="Retire this standard…" variant="secondary" onPress={() => setAsking(true)} testID="retire-standard" /></View>
      ) : null}
      <ConfirmDialog
        visible={asking}
        title="Retire this standard?"
        body="It stays in the register as retired, with its evidence and signature; the lab may no longer cite it as current."
        confirmLabel="Retire it"
        busy={retire.isPending}
        busyLabel="Retiring…"
        error={shownReasonError ? null : retire.error}
        onCancel={() => setAsking(false)}
        onConfirm={confirmRetire}
      >
        <TextField
          label="Reason"
          hint="At least 10 characters; it is recorded in the audit trail."
          value={reason}
          onChangeText={(t) => {
            setReason(t);
            setReasonError(undefined);
            if (retire.isError) retire.reset();
          }}
          error={shownReasonError}
          multiline
          testID="retire-reason"
        />
      </ConfirmDialog>
    </View>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  head: { gap: space.sm },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  actions: { flexDirection: 'row' },
});
