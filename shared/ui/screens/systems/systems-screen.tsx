import { AreaOverview } from '../area/area-overview';

export function SystemsScreen() {
  return <AreaOverview area="systems" />;
}
