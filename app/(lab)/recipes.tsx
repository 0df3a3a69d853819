import { RecipesScreen } from '@/shared/ui/screens/recipes/recipes-screen';

export default function RecipesRoute() {
  return <RecipesScreen />;
}
