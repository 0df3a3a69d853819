import { AreaOverview } from '../area/area-overview';

export function LabScreen() {
  return <AreaOverview area="lab" />;
}
