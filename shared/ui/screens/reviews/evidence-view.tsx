/** A submission and its evidence, as the reviewer reads it, with the decision buttons. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Evidence, Submission } from '@/shared/api/approval';
import { useEvidence, useSubmission } from '@/shared/ui/api/reviews';
import { useSession } from '@/shared/ui/api/use-session';
import { AppText, Button, Caution, StatusBadge } from '@/shared/ui/components';
import { useLabRole } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { SettingsSummaryPanel } from '../kit/settings-summary';
import { Verdict } from '../kit/verdict';
import { DecisionRecord } from './decision-record';
import { EvidenceStudies } from './evidence-studies';
import { SubmissionBadge } from './review-list';
import { ScopeFacts } from './scope-facts';
import { SignOffDialog, type Decision } from './sign-off-dialog';

export function EvidenceScreenBody({ labId, submissionId }: { labId: string; submissionId: string }) {
  const submission = useSubmission(labId, submissionId);
  const evidence = useEvidence(labId, submissionId);
  return (
    <QueryView query={submission} loadingLabel="Loading the submission…">
      {(s) => (
        <View style={styles.body} testID="evidence-view">
          <SubmissionHead labId={labId} submission={s} />
          <QueryView query={evidence} loadingLabel="Loading the evidence…">
            {(e) => <EvidenceBody evidence={e} />}
          </QueryView>
        </View>
      )}
    </QueryView>
  );
}

/** The submitter of a returned submission may put it forward again (once: then it links onward). */
function ResubmitAction({ submission: s }: { submission: Submission }) {
  const session = useSession();
  const mine = session.status === 'signed-in' && session.me.user.id === s.submittedBy.id;
  if (s.status !== 'returned') return null;
  if (s.resubmittedAs) return <TextLink href={`/reviews/${s.resubmittedAs}`} testID="resubmitted-link">It was submitted again: open the new submission</TextLink>;
  if (!mine) return null;
  return (
    <View style={styles.resubmit} testID="resubmit-panel">
      <AppText variant="body">Returned to you. Answer the reason, then submit this version or a newer one again.</AppText>
      <TextLink href={`/reviews/submit?from=${encodeURIComponent(s.id)}`} testID="resubmit">Resubmit for review</TextLink>
    </View>
  );
}

function SubmissionHead({ labId, submission: s }: { labId: string; submission: Submission }) {
  const role = useLabRole();
  const [decision, setDecision] = useState<Decision | null>(null);
  const mayDecide = role === 'reviewer' && s.status === 'pending' && s.blockedForYou.length === 0;
  return (
    <>
      <View style={styles.head}>
        <AppText variant="label" tone="muted">Review</AppText>
        <AppText variant="title" role="heading" aria-level={1} testID="screen-title">{`${s.recipe.name} v${s.recipe.version}`}</AppText>
        <View style={styles.badges}>
          <SubmissionBadge submission={s} />
          {s.stale ? <StatusBadge tone="warning" label={`Newer version v${s.recipe.latestVersion} exists`} /> : null}
        </View>
        <AppText variant="small" tone="muted">{`Submitted by ${s.submittedBy.displayName}, ${formatDateTime(s.submittedAt)}`}</AppText>
      </View>
      {mayDecide ? (
        <View style={styles.actions}>
          <Button label="Sign off…" onPress={() => setDecision('approved')} testID="open-sign-off" />
          <Button label="Return…" variant="secondary" onPress={() => setDecision('returned')} testID="open-return" />
        </View>
      ) : null}
      {s.status === 'pending' && role === 'reviewer' && s.blockedForYou.length > 0 ? (
        <Caution title={`${s.viewer.displayName} (${s.viewer.email}) may not decide this one`}>
          <View style={styles.list} testID="blocked-reasons">{s.blockedForYou.map((why) => <AppText key={why} variant="body">{why}</AppText>)}</View>
        </Caution>
      ) : null}
      {s.status === 'pending' && role === 'reviewer' ? <AppText variant="small" tone="muted" testID="independence-rule">{s.rule}</AppText> : null}
      {s.decision ? <DecisionRecord decision={s.decision} standardId={s.standardId} standardStatus={s.standardStatus} /> : null}
      <ResubmitAction submission={s} />
      <Panel title="Scope">
        <ScopeFacts scope={s.scope} />
        {s.purpose ? <AppText variant="body">{s.purpose}</AppText> : null}
      </Panel>
      <Panel title="How the evidence covers the scope" aside={<Verdict pass={s.coverage.covered} />}>
        <View style={styles.list} testID="coverage-checks">
          {s.coverage.checks.map((c) => (
            <View key={c.id} style={styles.check}>
              <StatusBadge tone={c.ok ? 'pass' : 'fail'} label={c.ok ? 'Covered' : 'Not covered'} />
              <AppText variant="body" style={styles.flex}>{c.detail}</AppText>
            </View>
          ))}
        </View>
      </Panel>
      {s.failingCriteria.length > 0 || s.justification ? (
        <Panel title="Failed criteria and the justification">
          {s.failingCriteria.map((f) => (
            <AppText key={`${f.studyId}-${f.scenario}-${f.label}`} variant="small">{`${f.scenario}: ${f.label} — observed ${f.observed ?? '—'} ${f.unit}, limit ${f.limit} ${f.unit}`}</AppText>
          ))}
          <AppText variant="body" testID="justification">{s.justification ? `Justification: ${s.justification}` : 'No justification given.'}</AppText>
        </Panel>
      ) : null}
      <SignOffDialog labId={labId} submission={s} decision={decision} onClose={() => setDecision(null)} />
      {s.standardId ? <TextLink href={`/standards/${s.standardId}`}>{s.standardStatus === 'retired' ? 'Open the standard it became (retired)' : 'Open the standard it became'}</TextLink> : null}
    </>
  );
}

function EvidenceBody({ evidence }: { evidence: Evidence }) {
  return (
    <View style={styles.body}>
      {evidence.settings ? <SettingsSummaryPanel summary={evidence.settings} title={evidence.submission.status === 'approved' ? 'Settings signed off' : 'Settings under review'} /> : null}
      <EvidenceStudies evidence={evidence} />
    </View>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  head: { gap: space.sm },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  list: { gap: space.sm },
  check: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  flex: { flex: 1 },
  resubmit: { gap: space.sm },
});
