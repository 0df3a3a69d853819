import { AreaOverview } from '../area/area-overview';

export function ScenariosScreen() {
  return <AreaOverview area="scenarios" />;
}
