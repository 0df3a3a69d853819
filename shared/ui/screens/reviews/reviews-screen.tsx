import { AreaOverview } from '../area/area-overview';

export function ReviewsScreen() {
  return <AreaOverview area="reviews" />;
}
