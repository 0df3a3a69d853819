import { AreaOverview } from '../area/area-overview';

export function RecipesScreen() {
  return <AreaOverview area="recipes" />;
}
