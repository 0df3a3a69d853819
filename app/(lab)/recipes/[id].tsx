import { useLocalSearchParams } from 'expo-router';
import { RecipesScreen } from '@/shared/ui/screens/recipes/recipes-screen';

/** /recipes/new and /recipes/:id — the editor (beside the list on a wide screen). */
export default function RecipeRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RecipesScreen id={typeof id === 'string' ? id : undefined} />;
}
