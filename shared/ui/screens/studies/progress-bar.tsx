/** A study's progress: a bar with runs done of all, failures, the scenario running and the ETA. */
import { StyleSheet, View } from 'react-native';
import type { StudyProgress } from '@/shared/api/work';
import { AppText } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { formatDuration } from '../kit/figure';

export function progressFraction(p: Pick<StudyProgress, 'done' | 'failed' | 'total'>): number {
  if (p.total <= 0) return 0;
  return Math.min(1, (p.done + p.failed) / p.total);
}

export function ProgressBar({ progress, compact = false }: { progress: StudyProgress; compact?: boolean }) {
  const fraction = progressFraction(progress);
  const percent = Math.round(fraction * 100);
  const runs = progress.done + progress.failed;
  return (
    <View style={styles.wrap} testID="study-progress">
      <View
        role="progressbar"
        aria-label="Runs done"
        aria-valuemin={0}
        aria-valuemax={progress.total}
        aria-valuenow={runs}
        aria-valuetext={`${runs} of ${progress.total} runs (${percent} %)`}
        style={[styles.track, compact && styles.trackCompact]}
      >
        <View style={[styles.fill, { width: `${percent}%` }]} />
      </View>
      <View style={styles.facts}>
        <AppText variant="number" testID="progress-runs">{`${runs} / ${progress.total} runs · ${percent} %`}</AppText>
        <AppText variant="number" tone="muted" testID="progress-eta">
          {progress.etaSeconds !== null ? `about ${formatDuration(progress.etaSeconds)} left` : progress.status === 'queued' ? 'waiting to start' : 'estimating time left…'}
        </AppText>
      </View>
      {!compact && progress.currentScenario ? (
        <AppText variant="small" tone="muted">{`Now running: ${progress.currentScenario.name}`}</AppText>
      ) : null}
      {progress.failed > 0 ? (
        <AppText variant="small" tone="fail">{`${progress.failed} run${progress.failed === 1 ? '' : 's'} failed; the rest go on.`}</AppText>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  track: {
    height: space.md,
    borderRadius: radius.round,
    backgroundColor: colors.surfaceSunken,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  trackCompact: { height: space.sm },
  fill: { height: '100%', backgroundColor: colors.focus },
  facts: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'space-between', gap: space.sm },
});
