/** Studies: the list, and the chosen study beside it on a wide screen. */
import { useRouter } from 'expo-router';
import { View, StyleSheet } from 'react-native';
import { Button, EmptyState } from '@/shared/ui/components';
import { useCurrentLab } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { space } from '@/shared/ui/theme';
import { PageHead, TextLink } from '../kit/panel';
import { TwoPane } from '../kit/two-pane';
import { StudyDetail } from './study-detail';
import { StudyList } from './study-list';

export function StudiesScreen({ studyId }: { studyId?: string }) {
  const lab = useCurrentLab();
  const router = useRouter();
  const area = areaById('studies');
  const labId = lab?.labId ?? '';
  const canStart = lab?.role === 'analyst';
  const list = (
    <View style={styles.list}>
      <PageHead
        title={studyId ? 'Studies' : area.label}
        eyebrow={area.group}
        intro={studyId ? undefined : area.purpose}
        actions={
          <>
            {canStart ? <Button label="Start a study" onPress={() => router.push('/studies/new')} testID="start-study" /> : null}
            <TextLink href="/uploads">Uploads</TextLink>
          </>
        }
      />
      <StudyList labId={labId} selectedId={studyId} />
    </View>
  );
  const detail = studyId ? <StudyDetail labId={labId} studyId={studyId} /> : undefined;
  return (
    <TwoPane
      title={studyId ? 'Study' : 'Studies'}
      list={list}
      detail={detail ?? <WideHint />}
      phoneShowsList={!studyId}
    />
  );
}

function WideHint() {
  return <EmptyState title="Choose a study" body="Its progress, its pass/fail matrix and its plots open here." />;
}

const styles = StyleSheet.create({ list: { gap: space.lg } });
