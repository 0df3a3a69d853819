import { AreaOverview } from '../area/area-overview';

export function StudiesScreen() {
  return <AreaOverview area="studies" />;
}
