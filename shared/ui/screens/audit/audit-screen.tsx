/** The audit trail: integrity check, filters, pages of entries and the CSV export. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { auditExportPath, useAuditTrail, type AuditFilter } from '@/shared/ui/api/audit';
import { useMembers } from '@/shared/ui/api/members';
import { AppText, Button, EmptyState, TextField } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { SelectField } from '../kit/choice-field';
import { PageHead, Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { Column } from '../kit/two-pane';
import { AuditList } from './audit-list';
import { IntegrityCheck } from './integrity-check';

const PAGE = 25;
const DAY = /^\d{4}-\d{2}-\d{2}$/;

export function AuditScreen() {
  const labId = useLabId();
  const role = useLabRole();
  const allowed = role === 'admin' || role === 'auditor';
  return (
    <Column title="Audit trail">
      <PageHead title="Audit trail" eyebrow="Evidence" intro="Every change in the lab, newest first. Each entry carries a hash of its contents and of the entry before it, sealed with a key kept outside the database, and checkpoints in a separate file record how long the trail was, so a changed, removed or cut-off entry shows." />
      {allowed ? <AuditBody labId={labId} /> : <EmptyState title="Not for your role" body="The audit trail is read by lab admins and auditors." testID="role-refused" />}
    </Column>
  );
}

function AuditBody({ labId }: { labId: string }) {
  const [draft, setDraft] = useState({ action: '', actor: '', from: '', to: '' });
  const [filter, setFilter] = useState<AuditFilter>({ limit: PAGE, offset: 0 });
  const [problem, setProblem] = useState<string | null>(null);
  const trail = useAuditTrail(labId, filter);
  const members = useMembers(labId);
  const apply = () => {
    const bad = (['from', 'to'] as const).find((k) => draft[k].trim() !== '' && !DAY.test(draft[k].trim()));
    if (bad) return setProblem('Use a date such as 2026-12-01');
    setProblem(null);
    setFilter({ ...draft, limit: PAGE, offset: 0 });
  };
  const offset = filter.offset ?? 0;
  return (
    <>
      <IntegrityCheck labId={labId} />
      <Panel title="Filters">
        <TextField label="Action" hint="An action, or a family with *, e.g. reviews.* or studies.start" value={draft.action} onChangeText={(action) => setDraft((d) => ({ ...d, action }))} autoCapitalize="none" testID="audit-action" />
        <SelectField label="Who" emptyLabel="Anyone" value={draft.actor || undefined} options={(members.data?.items ?? []).map((m) => ({ value: m.userId, label: m.displayName }))} onChange={(actor) => setDraft((d) => ({ ...d, actor }))} />
        <View style={styles.row}>
          <View style={styles.flex}><TextField label="From (UTC day)" value={draft.from} onChangeText={(from) => setDraft((d) => ({ ...d, from }))} error={problem && draft.from && !DAY.test(draft.from) ? problem : undefined} /></View>
          <View style={styles.flex}><TextField label="To, inclusive (UTC day)" value={draft.to} onChangeText={(to) => setDraft((d) => ({ ...d, to }))} error={problem && draft.to && !DAY.test(draft.to) ? problem : undefined} /></View>
        </View>
        <View style={styles.row}>
          <Button label="Apply filters" variant="secondary" compact onPress={apply} testID="audit-apply" />
          <TextLink href={auditExportPath(labId)} external testID="audit-export">Export the whole trail (CSV, with hashes)</TextLink>
        </View>
      </Panel>
      <QueryView query={trail} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No entries match', body: 'Nothing in the trail matches these filters.' }} loadingLabel="Loading the trail…">
        {(d) => (
          <View style={styles.wrap}>
            <AppText variant="small" tone="muted" testID="audit-count">{`Entries ${offset + 1}–${offset + d.items.length} of ${d.total}`}</AppText>
            <AuditList items={d.items} />
            <View style={styles.row}>
              <Button label="Newer" variant="secondary" compact disabled={offset === 0} onPress={() => setFilter((f) => ({ ...f, offset: Math.max(0, offset - PAGE) }))} />
              <Button label="Older" variant="secondary" compact disabled={offset + d.items.length >= d.total} onPress={() => setFilter((f) => ({ ...f, offset: offset + PAGE }))} />
            </View>
          </View>
        )}
      </QueryView>
    </>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
  flex: { flex: 1, minWidth: 140 },
});
