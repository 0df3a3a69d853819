/** The lab's studies, newest first: status, verdict, and a bar while one runs. */
import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';
import type { StudyList as StudyListData } from '@/shared/api/work';
import { isActive, studyKeys, useStudies, useStudy } from '@/shared/ui/api/studies';
import { AppText } from '@/shared/ui/components';
import { areaById } from '@/shared/ui/navigation/areas';
import { space } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { RowLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { StudyStatusBadge, Verdict } from '../kit/verdict';
import { ProgressBar } from './progress-bar';

type Row = StudyListData['items'][number];

/**
 * A running study's bar in a list. It polls the study itself (the detail screen's stream writes
 * the same cache entry), so a list of several running studies holds no long-lived connections;
 * when the study ends, the lists are fetched again.
 */
function ActiveProgress({ labId, study }: { labId: string; study: Row }) {
  const client = useQueryClient();
  const live = useStudy(labId, study.id, { poll: true });
  const status = live.data?.status ?? study.status;
  useEffect(() => {
    if (!isActive(status)) void client.invalidateQueries({ queryKey: [...studyKeys.lab(labId), 'list'] });
  }, [client, labId, status]);
  return <ProgressBar progress={live.data?.progress ?? study.progress} compact />;
}

export function StudyRows({ labId, items, selectedId }: { labId: string; items: StudyListData['items']; selectedId?: string }) {
  return (
    <View style={styles.list} testID="study-list">
      {items.map((study) => (
        <RowLink key={study.id} href={`/studies/${study.id}`} label={study.name} active={study.id === selectedId} testID={`study-row-${study.id}`}>
          <View style={styles.text}>
            <AppText variant="bodyStrong">{study.name}</AppText>
            <AppText variant="small" tone="muted">
              {`${study.recipe.name} v${study.recipe.version} · ${study.seeds} seeds · ${formatDateTime(study.createdAt)}`}
            </AppText>
            {isActive(study.status) ? <ActiveProgress labId={labId} study={study} /> : null}
            <View style={styles.badges}>
              <StudyStatusBadge status={study.status} />
              {study.status === 'finished' ? <Verdict pass={study.pass} /> : null}
            </View>
          </View>
        </RowLink>
      ))}
    </View>
  );
}

export function StudyList({ labId, selectedId }: { labId: string; selectedId?: string }) {
  const studies = useStudies(labId);
  const area = areaById('studies');
  return (
    <QueryView query={studies} isEmpty={(d) => d.items.length === 0} empty={{ title: area.emptyTitle, body: area.emptyBody }} loadingLabel="Loading studies…">
      {(data) => <StudyRows labId={labId} items={data.items} selectedId={selectedId} />}
    </QueryView>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  text: { flex: 1, gap: space.xs },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
