/** A finished study's results: overall figures, the pass/fail matrix, warnings. */
import { StyleSheet, View } from 'react-native';
import type { Study, StudyResults } from '@/shared/api/work';
import { useStudyResults } from '@/shared/ui/api/studies';
import { AppText, Caution } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { Panel } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { ResultsMatrix } from './results-matrix';

/** How many scenario × criterion cells passed. */
export function passCount(results: StudyResults): { passed: number; total: number } {
  let passed = 0;
  let total = 0;
  for (const s of results.scenarios)
    for (const c of s.criteria) {
      total++;
      if (c.pass) passed++;
    }
  return { passed, total };
}

export function StudyResultsView({ labId, study }: { labId: string; study: Study }) {
  const results = useStudyResults(labId, study.id, study.status === 'finished');
  return (
    <QueryView
      query={results}
      isEmpty={(r) => r.scenarios.length === 0}
      empty={{ title: 'No results stored', body: 'The study finished without any scenario results.' }}
      loadingLabel="Loading the results…"
    >
      {(data) => {
        const { passed, total } = passCount(data);
        const warned = data.scenarios.filter((s) => s.warnings.length > 0);
        return (
          <View style={styles.wrap}>
            <Panel title="Results" testID="study-results">
              <AppText variant="body" testID="results-summary">
                {`${passed} of ${total} criteria passed over ${data.scenarios.length} scenario${data.scenarios.length === 1 ? '' : 's'}. Choose a scenario for its plots.`}
              </AppText>
              <ResultsMatrix studyId={study.id} scenarios={data.scenarios} />
            </Panel>
            {warned.length > 0 ? (
              <Caution title="Warnings from the runs">
                <View style={styles.warnings}>
                  {warned.flatMap((s) =>
                    s.warnings.map((w) => (
                      <AppText key={`${s.scenarioId}-${w.message}`} variant="small">
                        {`${s.name}: ${w.message} (${w.runs} run${w.runs === 1 ? '' : 's'})`}
                      </AppText>
                    )),
                  )}
                </View>
              </Caution>
            ) : null}
          </View>
        );
      }}
    </QueryView>
  );
}

const styles = StyleSheet.create({ wrap: { gap: space.lg }, warnings: { gap: space.xs } });
