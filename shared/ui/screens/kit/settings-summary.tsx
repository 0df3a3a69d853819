/**
 * What is signed, where it is signed: the processing settings and acceptance criteria of one
 * recipe version as labelled rows with units (shared/api/settings-summary.ts), with a link to
 * that version of the recipe. Used by the review, the standard and the validation report.
 */
import { StyleSheet, View } from 'react-native';
import type { SettingsRow, SettingsSummary } from '@/shared/api/settings-summary';
import { AppText } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { Panel, TextLink } from './panel';

export const recipeVersionHref = (recipe: { id: string; version: number }) => `/recipes/${encodeURIComponent(recipe.id)}?version=${recipe.version}`;

function Row({ row }: { row: SettingsRow }) {
  const unit = row.value === '—' || row.unit === '' ? '' : row.unit === '°' ? '°' : ` ${row.unit}`;
  return (
    <View style={styles.row} role="listitem" testID={`setting-${row.id}`}>
      <View style={styles.label}>
        <AppText variant="small">{row.label}</AppText>
        {row.note ? <AppText variant="label" tone="muted">{row.note}</AppText> : null}
      </View>
      <AppText variant="number" style={styles.value}>{`${row.value}${unit}`}</AppText>
    </View>
  );
}

export function SettingsSummaryPanel({ summary, title = 'Processing settings' }: { summary: SettingsSummary; title?: string }) {
  const processing = summary.rows.filter((r) => r.group === 'processing');
  const criteria = summary.rows.filter((r) => r.group === 'criteria');
  return (
    <Panel title={title} testID="settings-summary">
      <View style={styles.head}>
        <AppText variant="small" tone="muted" style={styles.flex}>{`Recipe "${summary.recipe.name}" version ${summary.recipe.version}`}</AppText>
        <TextLink href={recipeVersionHref(summary.recipe)} testID="settings-recipe-link">{`Open version ${summary.recipe.version}`}</TextLink>
      </View>
      <View role="list" aria-label="Processing settings" style={styles.list}>
        {processing.map((r) => <Row key={r.id} row={r} />)}
      </View>
      <AppText variant="smallStrong" role="heading" aria-level={3}>Acceptance criteria</AppText>
      {criteria.length ? (
        <View role="list" aria-label="Acceptance criteria" style={styles.list}>
          {criteria.map((r) => <Row key={r.id} row={r} />)}
        </View>
      ) : (
        <AppText variant="small" tone="muted">This version sets no tolerance.</AppText>
      )}
    </Panel>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'baseline', gap: space.md },
  flex: { flexGrow: 1, flexBasis: 180 },
  list: { borderTopWidth: stroke.rule, borderTopColor: colors.border },
  row: { flexDirection: 'row', alignItems: 'baseline', gap: space.md, paddingVertical: space.xs, borderBottomWidth: stroke.rule, borderBottomColor: colors.border },
  label: { flex: 1, gap: space.xs },
  value: { textAlign: 'right', flexShrink: 1, maxWidth: '50%' },
});
