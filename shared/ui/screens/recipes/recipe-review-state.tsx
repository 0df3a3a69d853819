/**
 * Where each version of a recipe stands in review: an approved version says so and links to its
 * standard; a retired or superseded one says that too. A link to one version (?version=N, from a
 * review, a standard or a report) opens with that version marked and its settings listed.
 */
import { StyleSheet, View } from 'react-native';
import type { RecipeLifecycle, RecipeState } from '@/shared/api/approval';
import { settingsSummary } from '@/shared/api/settings-summary';
import { recipesApi } from '@/shared/ui/api/recipes';
import { useRecipeLifecycle } from '@/shared/ui/api/reviews';
import { AppText, StatusBadge, type StatusTone } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { formatDate } from '../kit/figure';
import { Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { SettingsSummaryPanel } from '../kit/settings-summary';

const STATE: Record<RecipeState, { tone: StatusTone; label: string; words: string }> = {
  draft: { tone: 'neutral', label: 'Draft', words: 'not submitted for review' },
  in_review: { tone: 'neutral', label: 'In review', words: 'waiting for a reviewer' },
  returned: { tone: 'warning', label: 'Returned', words: 'returned by the reviewer' },
  approved: { tone: 'pass', label: 'Approved', words: 'approved: a standard of the lab' },
  retired: { tone: 'neutral', label: 'Retired', words: 'was approved; its standard is retired' },
  superseded: { tone: 'neutral', label: 'Superseded', words: 'was approved; superseded by a newer version' },
};

type Version = RecipeLifecycle['versions'][number];

function VersionLine({ v, marked }: { v: Version; marked: boolean }) {
  const s = STATE[v.state];
  return (
    <View role="listitem" style={[styles.line, marked && styles.marked]} testID={`recipe-version-${v.version}`}>
      <View style={styles.lineHead}>
        <AppText variant="bodyStrong">{`Version ${v.version}`}</AppText>
        <StatusBadge tone={s.tone} label={s.label} />
      </View>
      <AppText variant="small" tone="muted">{`${s.words}${v.stateChangedAt ? `, ${formatDate(v.stateChangedAt)}` : ''} · written by ${v.author.displayName}`}</AppText>
      <View style={styles.links}>
        {v.standardId ? <TextLink href={`/standards/${v.standardId}`} testID={`recipe-standard-${v.version}`}>{v.state === 'approved' ? 'Open its standard' : 'Open its former standard'}</TextLink> : null}
        {v.submissionId ? <TextLink href={`/reviews/${v.submissionId}`}>Its review</TextLink> : null}
      </View>
    </View>
  );
}

export function RecipeReviewState({ labId, recipeId, version }: { labId: string; recipeId: string; version?: number }) {
  const lifecycle = useRecipeLifecycle(labId, recipeId);
  const chosen = recipesApi.useVersion(labId, recipeId, version ?? null);
  return (
    <>
      <Panel title="Review and approval" testID="recipe-review-state">
        <QueryView query={lifecycle} loadingLabel="Loading the review state…">
          {(l) => {
            const shown = l.versions.filter((v) => v.state !== 'draft' || v.version === version || v.version === l.latestVersion);
            return (
              <View role="list" aria-label="Versions in review" style={styles.list}>
                {shown.map((v) => <VersionLine key={v.version} v={v} marked={v.version === version} />)}
              </View>
            );
          }}
        </QueryView>
      </Panel>
      {version && chosen.data ? (
        <SettingsSummaryPanel summary={settingsSummary({ id: recipeId, version, name: chosen.data.version.name }, chosen.data.definition)} title={`Settings of version ${version}`} />
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  line: { gap: space.xs, paddingLeft: space.md, borderLeftWidth: stroke.plumb, borderLeftColor: colors.border },
  marked: { borderLeftColor: colors.primary },
  lineHead: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
