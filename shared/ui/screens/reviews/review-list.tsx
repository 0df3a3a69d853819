/** The review inbox (waiting) and past decisions, as list rows. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Submission } from '@/shared/api/approval';
import { useReviews, type ReviewFilter } from '@/shared/ui/api/reviews';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { areaById } from '@/shared/ui/navigation/areas';
import { space } from '@/shared/ui/theme';
import { ChoiceChips } from '../kit/choice-field';
import { formatDateTime } from '../kit/figure';
import { RowLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { scopeLine } from './scope-facts';

export function SubmissionBadge({ submission }: { submission: Pick<Submission, 'status'> }) {
  if (submission.status === 'approved') return <StatusBadge tone="pass" label="Approved" />;
  if (submission.status === 'returned') return <StatusBadge tone="warning" label="Returned" />;
  return <StatusBadge tone="neutral" label="Waiting for review" />;
}

export function SubmissionRow({ submission, active }: { submission: Submission; active?: boolean }) {
  return (
    <RowLink href={`/reviews/${submission.id}`} label={`${submission.recipe.name} v${submission.recipe.version}`} active={active} testID={`review-row-${submission.id}`}>
      <View style={styles.text}>
        <AppText variant="bodyStrong">{`${submission.recipe.name} v${submission.recipe.version}`}</AppText>
        <AppText variant="small" tone="muted">{scopeLine(submission.scope)}</AppText>
        <AppText variant="small" tone="muted">{`Submitted by ${submission.submittedBy.displayName}, ${formatDateTime(submission.submittedAt)}`}</AppText>
        <View style={styles.badges}>
          <SubmissionBadge submission={submission} />
          {submission.failingCriteria.length > 0 ? <StatusBadge tone="warning" label={`${submission.failingCriteria.length} criteria failed`} /> : null}
          {submission.status === 'pending' && submission.blockedForYou.length === 0 ? <StatusBadge tone="neutral" label="You may decide" /> : null}
        </View>
      </View>
    </RowLink>
  );
}

const filters = [
  { value: 'pending', label: 'Waiting' },
  { value: 'decided', label: 'Decided' },
] as const;

export function ReviewList({ labId, selectedId }: { labId: string; selectedId?: string }) {
  const [show, setShow] = useState<'pending' | 'decided'>('pending');
  const filter: ReviewFilter = show === 'pending' ? { status: 'pending' } : {};
  const reviews = useReviews(labId, filter);
  const area = areaById('reviews');
  return (
    <View style={styles.wrap}>
      <ChoiceChips label="Show" options={filters} value={show} onChange={setShow} />
      <QueryView
        query={reviews}
        isEmpty={(d) => d.items.filter((s) => show === 'pending' || s.status !== 'pending').length === 0}
        empty={show === 'pending' ? { title: area.emptyTitle, body: area.emptyBody } : { title: 'No decisions yet', body: 'Approved and returned submissions will be listed here.' }}
        loadingLabel="Loading submissions…"
      >
        {(data) => (
          <View style={styles.list} testID="review-list">
            {data.items
              .filter((s) => show === 'pending' || s.status !== 'pending')
              .map((s) => (
                <SubmissionRow key={s.id} submission={s} active={s.id === selectedId} />
              ))}
          </View>
        )}
      </QueryView>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  list: { gap: space.sm },
  text: { flex: 1, gap: space.xs },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
