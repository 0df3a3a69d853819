/**
 * A resource's versions, newest first, and the differences between any two of them field by field;
 * an older version can be loaded into the editor (saving it makes a new version — nothing is lost).
 */
import { useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { UseQueryResult } from '@tanstack/react-query';
import type { VersionInfo } from '@/shared/api/work';
import { AppText, Button } from '@/shared/ui/components';
import { SelectField } from '@/shared/ui/screens/kit/choice-field';
import { ConfirmDialog } from '@/shared/ui/screens/kit/confirm-dialog';
import { formatDateTime } from '@/shared/ui/screens/kit/figure';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { QueryView } from '@/shared/ui/screens/kit/query-view';
import { colors, space, stroke } from '@/shared/ui/theme';
import { diffDefinitions, leafText, type FieldChange } from '@/shared/api/definition-diff';

interface VersionHistoryProps {
  versions: UseQueryResult<VersionInfo[]>;
  /** Loads one version's definition (react-query hook of the resource). */
  useVersion: (version: number | null) => UseQueryResult<{ definition: unknown }>;
  onLoad?: (version: number, definition: unknown) => void;
  /** The editor holds unsaved changes: loading a version asks first. */
  dirty?: boolean;
}

const kindWords: Record<FieldChange['kind'], string> = { added: 'Added', removed: 'Removed', changed: 'Changed' };

export function VersionHistory({ versions, useVersion, onLoad, dirty = false }: VersionHistoryProps) {
  const [from, setFrom] = useState<number | null>(null);
  const [asking, setAsking] = useState(false);
  const [to, setTo] = useState<number | null>(null);
  const list = versions.data;
  useEffect(() => {
    if (!list || list.length === 0) return;
    setTo((t) => t ?? list[0].version);
    setFrom((f) => f ?? (list[1] ?? list[0]).version);
  }, [list]);
  const a = useVersion(from);
  const b = useVersion(to);
  const options = (list ?? []).map((v) => ({ value: String(v.version), label: `v${v.version}${v.note ? ` — ${v.note}` : ''}` }));
  const changes = a.data && b.data ? diffDefinitions(a.data.definition, b.data.definition) : null;
  return (
    <Panel title="Version history" testID="version-history">
      <QueryView query={versions} isEmpty={(d) => d.length === 0} empty={{ title: 'No versions yet', body: 'Save to make version 1.' }}>
        {(items) => (
          <View style={styles.gap}>
            <View role="list" aria-label="Versions" style={styles.gapSmall}>
              {items.map((v) => (
                <View role="listitem" key={v.version} style={styles.version}>
                  <AppText variant="number" style={styles.number}>{`v${v.version}`}</AppText>
                  <View style={styles.flex}>
                    <AppText variant="small">{v.note || 'No note'}</AppText>
                    <AppText variant="label" tone="muted">{`${formatDateTime(v.createdAt)} · ${v.author.displayName}`}</AppText>
                  </View>
                </View>
              ))}
            </View>
            {items.length > 1 ? (
              <View style={styles.gap}>
                <View style={styles.selects}>
                  <View style={styles.flex}>
                    <SelectField label="Compare version" options={options} value={from === null ? undefined : String(from)} onChange={(v) => setFrom(Number(v))} />
                  </View>
                  <View style={styles.flex}>
                    <SelectField label="with version" options={options} value={to === null ? undefined : String(to)} onChange={(v) => setTo(Number(v))} />
                  </View>
                </View>
                <ChangeTable changes={changes} from={from} to={to} />
                {onLoad && a.data && from !== null && from !== items[0].version ? (
                  <Button
                    label={`Load v${from} into the editor`}
                    variant="secondary"
                    compact
                    onPress={() => (dirty ? setAsking(true) : onLoad(from, a.data!.definition))}
                  />
                ) : null}
                <ConfirmDialog
                  visible={asking}
                  title={`Replace your changes with v${from}?`}
                  body="The editor holds changes that are not saved. Loading this version replaces them; saving afterwards makes a new version, and every stored version stays."
                  confirmLabel={`Load v${from}`}
                  onCancel={() => setAsking(false)}
                  onConfirm={() => {
                    setAsking(false);
                    if (onLoad && a.data && from !== null) onLoad(from, a.data.definition);
                  }}
                />
              </View>
            ) : null}
          </View>
        )}
      </QueryView>
    </Panel>
  );
}

function ChangeTable({ changes, from, to }: { changes: FieldChange[] | null; from: number | null; to: number | null }) {
  if (changes === null) return <AppText variant="small" tone="muted">Loading the two versions…</AppText>;
  if (changes.length === 0) {
    return <AppText variant="small" testID="no-changes">{`v${from} and v${to} have the same definition.`}</AppText>;
  }
  return (
    <View role="table" aria-label={`Changes from v${from} to v${to}`} style={styles.table} testID="change-table">
      <View role="row" style={[styles.row, styles.headRow]}>
        <AppText role="columnheader" variant="smallStrong" style={styles.field}>Field</AppText>
        <AppText role="columnheader" variant="smallStrong" style={styles.cell}>{`v${from}`}</AppText>
        <AppText role="columnheader" variant="smallStrong" style={styles.cell}>{`v${to}`}</AppText>
      </View>
      {changes.map((c) => (
        <View role="row" key={c.path} style={styles.row}>
          <View role="cell" style={styles.field}>
            <AppText variant="label">{c.path}</AppText>
            <AppText variant="small" tone="muted">{kindWords[c.kind]}</AppText>
          </View>
          <AppText role="cell" variant="number" style={styles.cell}>{leafText(c.before)}</AppText>
          <AppText role="cell" variant="number" style={styles.cell}>{leafText(c.after)}</AppText>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  gap: { gap: space.md },
  gapSmall: { gap: space.sm },
  flex: { flex: 1, minWidth: 140 },
  version: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  number: { width: 40, textAlign: 'right' },
  selects: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  table: { borderTopWidth: stroke.rule, borderTopColor: colors.border },
  row: { flexDirection: 'row', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: stroke.rule, borderBottomColor: colors.border },
  headRow: { backgroundColor: colors.surfaceSunken },
  field: { flex: 2 },
  cell: { flex: 1, textAlign: 'right' },
});
