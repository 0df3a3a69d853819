/** One study: what it runs, live progress with cancel while it runs, then its results. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Study } from '@/shared/api/work';
import { isActive, studyCsvLinks, useCancelStudy, useLiveStudy } from '@/shared/ui/api/studies';
import { AppText, Button } from '@/shared/ui/components';
import { useLabRole } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { formatDateTime } from '../kit/figure';
import { Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { StudyStatusBadge, Verdict } from '../kit/verdict';
import { ProgressBar } from './progress-bar';
import { StudyResultsView } from './study-results';

export function StudyDetail({ labId, studyId }: { labId: string; studyId: string }) {
  const { study, mode } = useLiveStudy(labId, studyId);
  return (
    <QueryView query={study} loadingLabel="Loading the study…">
      {(data) => <StudyBody labId={labId} study={data} live={mode} />}
    </QueryView>
  );
}

function StudyBody({ labId, study, live }: { labId: string; study: Study; live: string }) {
  const role = useLabRole();
  const [asking, setAsking] = useState(false);
  const cancel = useCancelStudy(labId);
  const links = studyCsvLinks(labId, study.id);
  return (
    <View style={styles.body} testID="study-detail">
      <View style={styles.head}>
        <AppText variant="label" tone="muted">
          Study
        </AppText>
        <AppText variant="title" role="heading" aria-level={1} testID="study-title">
          {study.name}
        </AppText>
        <View style={styles.badges}>
          <StudyStatusBadge status={study.status} testID="study-status" />
          {study.status === 'finished' ? <Verdict pass={study.pass} testID="study-verdict" /> : null}
        </View>
        <AppText variant="small" tone="muted">
          {`Recipe ${study.recipe.name} v${study.recipe.version} · ${study.scenarios.length} scenario${study.scenarios.length === 1 ? '' : 's'} × ${study.seeds} seeds · base seed ${study.baseSeed} · engine ${study.engineVersion}`}
        </AppText>
        <AppText variant="small" tone="muted">
          {`Started by ${study.createdBy.displayName}, ${formatDateTime(study.startedAt ?? study.createdAt)}${study.finishedAt ? ` · finished ${formatDateTime(study.finishedAt)}` : ''}`}
        </AppText>
      </View>

      {isActive(study.status) ? (
        <Panel title="Progress" aside={<AppText variant="label" tone="muted">{live === 'stream' ? 'live' : 'updated every 1.5 s'}</AppText>}>
          <ProgressBar progress={study.progress} />
          {role === 'analyst' ? (
            <View style={styles.actions}>
              <Button label="Cancel study" variant="secondary" onPress={() => setAsking(true)} testID="cancel-study" />
            </View>
          ) : null}
        </Panel>
      ) : null}

      {study.status === 'failed' ? (
        <Panel title="The study failed">
          <AppText variant="body" tone="fail" role="alert">
            {study.error ?? 'The study stopped with an error.'}
          </AppText>
        </Panel>
      ) : null}
      {study.status === 'cancelled' ? (
        <Panel title="Cancelled">
          <AppText variant="body">{`The study was cancelled after ${study.progress.done} of ${study.progress.total} runs. Start it again to get results.`}</AppText>
        </Panel>
      ) : null}

      {study.status === 'finished' ? (
        <>
          <StudyResultsView labId={labId} study={study} />
          <View style={styles.links}>
            <TextLink href={`/reports/study/${study.id}`} testID="study-report">Validation report</TextLink>
            <TextLink href={links.results} external testID="csv-results">Per-line results (CSV)</TextLink>
            <TextLink href={links.criteria} external testID="csv-criteria">Criteria and verdicts (CSV)</TextLink>
          </View>
        </>
      ) : null}

      <ConfirmDialog
        visible={asking}
        title="Cancel this study?"
        body={`Runs already done (${study.progress.done} of ${study.progress.total}) are kept, but the study will not finish and gives no verdict.`}
        confirmLabel="Cancel the study"
        cancelLabel="Keep it running"
        busy={cancel.isPending}
        busyLabel="Cancelling…"
        error={cancel.error}
        onCancel={() => setAsking(false)}
        onConfirm={() => cancel.mutate(study.id, { onSuccess: () => setAsking(false) })}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  head: { gap: space.sm },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  actions: { flexDirection: 'row', justifyContent: 'flex-end' },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
