/** Reviews: the inbox beside the chosen submission's evidence (one column on a phone). */
import { StyleSheet, View } from 'react-native';
import { EmptyState } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { space } from '@/shared/ui/theme';
import { PageHead, TextLink } from '../kit/panel';
import { TwoPane } from '../kit/two-pane';
import { EvidenceScreenBody } from './evidence-view';
import { ReviewList } from './review-list';

export function ReviewsScreen({ submissionId }: { submissionId?: string }) {
  const labId = useLabId();
  const role = useLabRole();
  const area = areaById('reviews');
  const list = (
    <View style={styles.list}>
      <PageHead title={submissionId ? 'Reviews' : area.label} eyebrow={area.group} intro={submissionId ? undefined : area.purpose} />
      {role === 'analyst' ? <TextLink href="/reviews/submit" testID="submit-review-link">Submit a recipe for review</TextLink> : null}
      <ReviewList labId={labId} selectedId={submissionId} />
    </View>
  );
  const detail = submissionId ? (
    <View style={styles.list}>
      <TextLink href="/reviews">All reviews</TextLink>
      <EvidenceScreenBody labId={labId} submissionId={submissionId} />
    </View>
  ) : (
    <EmptyState title="Choose a submission" body="Its scope, its evidence and the sign-off open here." />
  );
  return <TwoPane title={submissionId ? 'Review' : 'Reviews'} list={list} detail={detail} phoneShowsList={!submissionId} />;
}

const styles = StyleSheet.create({ list: { gap: space.lg } });
