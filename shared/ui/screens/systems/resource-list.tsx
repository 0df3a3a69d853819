/**
 * The list pane of systems, scenarios and recipes: search by name, pages of 20, each row a link
 * with its latest version and who changed it last, and the way to make a new one.
 */
import type { UseQueryResult } from '@tanstack/react-query';
import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { ResourceList as ResourceListData } from '@/shared/api/work';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { PageHead, RowLink } from '@/shared/ui/screens/kit/panel';
import { QueryView } from '@/shared/ui/screens/kit/query-view';
import { formatDate } from '@/shared/ui/screens/kit/figure';
import { space } from '@/shared/ui/theme';
import { PAGE_SIZE } from '@/shared/ui/api/versioned-resource';

export interface ResourceListProps {
  title: string;
  eyebrow?: string;
  intro: string;
  /** e.g. "system": used in "New system", "No systems match". */
  noun: string;
  basePath: string;
  query: UseQueryResult<ResourceListData>;
  search: string;
  onSearch: (q: string) => void;
  offset: number;
  onOffset: (offset: number) => void;
  activeId?: string;
  canWrite: boolean;
  empty: { title: string; body: string };
}

export function ResourceList(props: ResourceListProps) {
  const { title, eyebrow, intro, noun, basePath, query, search, onSearch, offset, onOffset, activeId, canWrite, empty } = props;
  const router = useRouter();
  const newAction = canWrite ? (
    <Button label={`New ${noun}`} variant={activeId ? 'secondary' : 'primary'} compact onPress={() => router.push(`${basePath}/new`)} />
  ) : null;
  return (
    <View style={styles.list}>
      <PageHead title={title} eyebrow={eyebrow} intro={intro} actions={newAction} />
      <TextField
        label={`Search ${noun}s`}
        placeholder="Part of the name"
        value={search}
        onChangeText={(q) => {
          onSearch(q);
          onOffset(0);
        }}
        autoCapitalize="none"
      />
      <QueryView
        query={query}
        isEmpty={(d) => d.items.length === 0}
        empty={search.trim() ? { title: `No ${noun}s match "${search.trim()}"`, body: 'Try a shorter part of the name.' } : empty}
        loadingLabel={`Loading ${noun}s…`}
      >
        {(data) => (
          <View style={styles.rows} role="list" aria-label={title}>
            {data.items.map((item) => (
              <View role="listitem" key={item.id}>
                <RowLink href={`${basePath}/${item.id}`} label={item.name} active={item.id === activeId} testID={`row-${item.id}`}>
                  <View style={styles.rowText}>
                    <AppText variant="bodyStrong" numberOfLines={2}>
                      {item.name}
                    </AppText>
                    {item.description ? (
                      <AppText variant="small" tone="muted" numberOfLines={2}>
                        {item.description}
                      </AppText>
                    ) : null}
                    <AppText variant="label" tone="muted">
                      {`v${item.latestVersion} · ${formatDate(item.updatedAt)} · ${item.updatedBy.displayName}`}
                    </AppText>
                  </View>
                </RowLink>
              </View>
            ))}
            <Pager total={data.total} offset={offset} count={data.items.length} onOffset={onOffset} noun={noun} />
          </View>
        )}
      </QueryView>
    </View>
  );
}

function Pager({ total, offset, count, onOffset, noun }: { total: number; offset: number; count: number; onOffset: (o: number) => void; noun: string }) {
  if (total <= PAGE_SIZE) {
    return (
      <AppText variant="small" tone="muted">
        {`${total} ${noun}${total === 1 ? '' : 's'}`}
      </AppText>
    );
  }
  return (
    <View style={styles.pager}>
      <Button label="Previous" variant="secondary" compact disabled={offset === 0} onPress={() => onOffset(Math.max(0, offset - PAGE_SIZE))} />
      <AppText variant="number" tone="muted">{`${offset + 1}–${offset + count} of ${total}`}</AppText>
      <Button label="Next" variant="secondary" compact disabled={offset + count >= total} onPress={() => onOffset(offset + PAGE_SIZE)} />
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.lg },
  rows: { gap: space.sm },
  rowText: { flex: 1, gap: space.hair },
  pager: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
});
