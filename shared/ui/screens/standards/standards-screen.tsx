/** The standards register with its filters, beside the chosen standard on a wide screen. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useStandards, type StandardFilter } from '@/shared/ui/api/standards';
import { AppText, EmptyState } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { areaById } from '@/shared/ui/navigation/areas';
import { space } from '@/shared/ui/theme';
import { formatDate } from '../kit/figure';
import { PageHead, RowLink, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { TwoPane } from '../kit/two-pane';
import { scopeLine } from '../reviews/scope-facts';
import { StandardBadge, StandardDetail } from './standard-detail';
import { StandardFilters } from './standard-filters';

export function StandardsScreen({ standardId }: { standardId?: string }) {
  const labId = useLabId();
  const role = useLabRole();
  const area = areaById('standards');
  const [filter, setFilter] = useState<StandardFilter>({});
  const standards = useStandards(labId, filter);
  const filtered = Object.values(filter).some((v) => v !== undefined && v !== 'active');
  const list = (
    <View style={styles.list}>
      <PageHead title={standardId ? 'Standards' : area.label} eyebrow={area.group} intro={standardId ? undefined : area.purpose}
        actions={role === 'admin' || role === 'auditor' ? <TextLink href="/audit">Audit trail</TextLink> : undefined} />
      <StandardFilters onApply={setFilter} />
      <QueryView query={standards} isEmpty={(d) => d.items.length === 0}
        empty={filtered ? { title: 'No standard covers this', body: 'No standard of the lab matches these filters. Widen the band or clear a filter.' } : { title: area.emptyTitle, body: area.emptyBody }}
        loadingLabel="Loading the register…">
        {(d) => (
          <View style={styles.rows} testID="standard-list">
            <AppText variant="small" tone="muted">{`${d.total} standard${d.total === 1 ? '' : 's'}`}</AppText>
            {d.items.map((s) => (
              <RowLink key={s.id} href={`/standards/${s.id}`} label={`${s.recipe.name} v${s.recipe.version}`} active={s.id === standardId}>
                <View style={styles.text}>
                  <AppText variant="bodyStrong">{`${s.recipe.name} v${s.recipe.version}`}</AppText>
                  <AppText variant="small" tone="muted">{scopeLine(s.scope)}</AppText>
                  <AppText variant="small" tone="muted">{`Review due ${formatDate(s.reviewDueAt)}`}</AppText>
                  <StandardBadge standard={s} />
                </View>
              </RowLink>
            ))}
          </View>
        )}
      </QueryView>
    </View>
  );
  const detail = standardId ? (
    <View style={styles.list}><TextLink href="/standards">The register</TextLink><StandardDetail labId={labId} standardId={standardId} /></View>
  ) : (
    <EmptyState title="Choose a standard" body="Its scope, signature, evidence and report open here." />
  );
  return <TwoPane title={standardId ? 'Standard' : 'Standards'} list={list} detail={detail} phoneShowsList={!standardId} />;
}

const styles = StyleSheet.create({ list: { gap: space.lg }, rows: { gap: space.sm }, text: { flex: 1, gap: space.xs } });
