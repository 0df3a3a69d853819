/** The four sections of the home screen, each a small query with its own states. */
import { StyleSheet, View } from 'react-native';
import type { Submission } from '@/shared/api/approval';
import type { Role } from '@/shared/api/auth';
import { useReviews } from '@/shared/ui/api/reviews';
import { useStandards } from '@/shared/ui/api/standards';
import { useStudies } from '@/shared/ui/api/studies';
import { AppText } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { formatDate } from '../kit/figure';
import { Panel, RowLink, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { SubmissionRow } from '../reviews/review-list';
import { scopeLine } from '../reviews/scope-facts';
import { StandardBadge } from '../standards/standard-detail';
import { StudyRows } from '../studies/study-list';

const DAY_MS = 86_400_000;
/** Standards whose review falls due within this many days are listed. */
export const DUE_WITHIN_DAYS = 60;

export function RunningStudies({ labId, canStart }: { labId: string; canStart: boolean }) {
  const running = useStudies(labId, { status: 'running' });
  const queued = useStudies(labId, { status: 'queued' });
  return (
    <Panel title="Studies running" testID="home-running">
      <QueryView query={running} isEmpty={(d) => d.items.length === 0 && (queued.data?.items.length ?? 0) === 0}
        empty={{ title: 'No study is running', body: 'Studies run in the background; their progress shows here while they run.', action: canStart ? <TextLink href="/studies/new">Start a study</TextLink> : undefined }}>
        {(d) => {
          const items = [...d.items, ...(queued.data?.items ?? [])];
          return <StudyRows labId={labId} items={items} />;
        }}
      </QueryView>
    </Panel>
  );
}

export function RecentResults({ labId }: { labId: string }) {
  const finished = useStudies(labId, { status: 'finished', limit: 5 });
  return (
    <Panel title="Recent results" aside={<TextLink href="/studies">All studies</TextLink>} testID="home-results">
      <QueryView query={finished} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No results yet', body: 'Finished studies with their verdicts will be listed here, newest first.' }}>
        {(d) => <StudyRows labId={labId} items={d.items} />}
      </QueryView>
    </Panel>
  );
}

export function WaitingReviews({ labId, role }: { labId: string; role: Role | null }) {
  const reviews = useReviews(labId, { status: 'pending', limit: 20 });
  const mine = role === 'reviewer';
  return (
    <Panel title={mine ? 'Reviews waiting for you' : 'Waiting for review'} aside={<TextLink href="/reviews">All reviews</TextLink>} testID="home-reviews">
      <QueryView query={reviews}
        isEmpty={(d) => d.items.filter((s) => !mine || s.blockedForYou.length === 0).length === 0}
        empty={{ title: mine ? 'Nothing waits for your sign-off' : 'Nothing is waiting for review', body: mine ? 'Submissions you may decide will appear here.' : 'Recipes submitted for sign-off appear here until a reviewer decides.' }}>
        {(d) => (
          <View style={styles.list}>
            {d.items.filter((s) => !mine || s.blockedForYou.length === 0).map((s) => <SubmissionRow key={s.id} submission={s} />)}
          </View>
        )}
      </QueryView>
    </Panel>
  );
}

/**
 * The analyst's own submissions a reviewer returned and that are not yet put forward again, at the
 * top of the Bench; the panel is left out while there are none.
 */
export function ReturnedToYou({ labId, userId }: { labId: string; userId: string }) {
  const returned = useReviews(labId, { status: 'returned', limit: 50 });
  const mine = (returned.data?.items ?? []).filter((s: Submission) => s.submittedBy.id === userId && !s.resubmittedAs);
  if (mine.length === 0) return null;
  return (
    <Panel title="Returned to you" testID="home-returned">
      <AppText variant="body">A reviewer sent these back. Read the reason, then open one to submit it again.</AppText>
      <View style={styles.list}>
        {mine.map((s) => (
          <View key={s.id} style={styles.text}>
            <SubmissionRow submission={s} />
            {s.decision?.reason ? <AppText variant="small">{`Reason: ${s.decision.reason}`}</AppText> : null}
          </View>
        ))}
      </View>
    </Panel>
  );
}

export function DueStandards({ labId }: { labId: string }) {
  // Rounded to the hour so the query key stays put between renders.
  const dueBefore = Math.ceil((Date.now() + DUE_WITHIN_DAYS * DAY_MS) / 3_600_000) * 3_600_000;
  const standards = useStandards(labId, { dueBefore, limit: 20 });
  return (
    <Panel title="Standards falling due" aside={<TextLink href="/standards">Register</TextLink>} testID="home-due">
      <QueryView query={standards} isEmpty={(d) => d.items.length === 0}
        empty={{ title: `None due in the next ${DUE_WITHIN_DAYS} days`, body: 'Active standards whose review falls due soon are listed here.' }}>
        {(d) => (
          <View style={styles.list}>
            {d.items.map((s) => (
              <RowLink key={s.id} href={`/standards/${s.id}`} label={`${s.recipe.name} v${s.recipe.version}`}>
                <View style={styles.text}>
                  <AppText variant="bodyStrong">{`${s.recipe.name} v${s.recipe.version}`}</AppText>
                  <AppText variant="small" tone="muted">{scopeLine(s.scope)}</AppText>
                  <AppText variant="number">{`Review due ${formatDate(s.reviewDueAt)}`}</AppText>
                  <StandardBadge standard={s} />
                </View>
              </RowLink>
            ))}
          </View>
        )}
      </QueryView>
    </Panel>
  );
}

const styles = StyleSheet.create({ list: { gap: space.sm }, text: { flex: 1, gap: space.xs } });
