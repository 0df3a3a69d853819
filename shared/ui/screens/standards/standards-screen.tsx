import { AreaOverview } from '../area/area-overview';

export function StandardsScreen() {
  return <AreaOverview area="standards" />;
}
