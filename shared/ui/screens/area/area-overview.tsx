import { Screen, EmptyState } from '@/shared/ui/components';
import { areaById, type AreaId } from '@/shared/ui/navigation/areas';

/** The first, empty version of an area's screen: what it is for and what will appear. */
export function AreaOverview({ area: id }: { area: Exclude<AreaId, 'about' | 'bench'> }) {
  const area = areaById(id);
  return (
    <Screen title={area.label} eyebrow={area.group} intro={area.purpose}>
      <EmptyState title={area.emptyTitle} body={area.emptyBody} testID="empty-state" />
    </Screen>
  );
}
