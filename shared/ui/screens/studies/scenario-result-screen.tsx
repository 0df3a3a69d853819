/** /studies/:id/:position — one scenario of a finished study: verdict, criteria, figures, plots. */
import { StyleSheet, View } from 'react-native';
import { studyCsvLinks, useStudy, useStudyResults } from '@/shared/ui/api/studies';
import { AppText, EmptyState } from '@/shared/ui/components';
import { useLabId } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { PageHead, TextLink } from '../kit/panel';
import { ErrorBox, LoadingRow } from '../kit/query-view';
import { Column } from '../kit/two-pane';
import { Verdict } from '../kit/verdict';
import { ComparisonPanels } from './scenario-facts';
import { ScenarioPlots } from './scenario-plots';

export function ScenarioResultScreen({ studyId, position }: { studyId: string; position: number }) {
  const labId = useLabId();
  const study = useStudy(labId, studyId);
  const results = useStudyResults(labId, studyId, study.data?.status === 'finished');
  const back = <TextLink href={`/studies/${studyId}`}>Back to the study</TextLink>;
  let body;
  if (study.isError || results.isError) body = <ErrorBox error={study.error ?? results.error} onRetry={() => void results.refetch()} />;
  else if (!study.data || (study.data.status === 'finished' && !results.data)) body = <LoadingRow label="Loading the results…" />;
  else if (study.data.status !== 'finished' || !results.data) body = <EmptyState title="No results yet" body="This study has not finished; its scenarios have no results yet." testID="empty-state" />;
  else {
    const scenario = results.data.scenarios[position];
    const entry = study.data.scenarios.find((s) => s.id === scenario?.scenarioId);
    if (!scenario || !entry) body = <EmptyState title="No such scenario in this study" body="The link points past the study's scenarios." testID="empty-state" />;
    else {
      const links = studyCsvLinks(labId, studyId);
      body = (
        <>
          <PageHead
            title={scenario.name}
            eyebrow={`${study.data.name} · scenario ${position + 1} of ${results.data.scenarios.length}`}
            intro={`${scenario.seeds} seeds against ${scenario.reference === 'exponential-window' ? 'the exact FRF seen through the exponential window' : 'the exact linear FRF'}${scenario.failedRuns ? `; ${scenario.failedRuns} runs failed` : ''}.`}
            actions={back}
          />
          <View style={styles.badges}>
            <Verdict pass={scenario.pass} testID="scenario-verdict" />
          </View>
          {scenario.referenceNote ? <AppText variant="small" tone="muted">{scenario.referenceNote}</AppText> : null}
          <ScenarioPlots labId={labId} study={study.data} scenario={scenario} allScenarios={results.data.scenarios} position={position} />
          <ComparisonPanels title="Criteria" comparison={scenario} />
          {scenario.plain ? <ComparisonPanels title="Against the plain linear FRF (damping corrected)" comparison={scenario.plain} /> : null}
          <View style={styles.links}>
            <TextLink href={links.results} external>Per-line results (CSV)</TextLink>
            <TextLink href={links.criteria} external>Criteria and verdicts (CSV)</TextLink>
          </View>
        </>
      );
    }
  }
  return <Column title="Scenario results">{body}</Column>;
}

const styles = StyleSheet.create({
  badges: { flexDirection: 'row', gap: space.sm },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
