/** Recipes: the lab's processing recipes and the editor of the chosen one. */
import { recipesApi } from '@/shared/ui/api/recipes';
import { VersionedResourceScreen } from '@/shared/ui/screens/systems/versioned-resource-screen';
import { RecipeEditor } from './recipe-editor';

export function RecipesScreen({ id }: { id?: string }) {
  return (
    <VersionedResourceScreen
      id={id}
      area="recipes"
      noun="recipe"
      useList={recipesApi.useList}
      Editor={RecipeEditor}
      chooseBody="Pick one to see its settings, window figures and history, or make a new one."
    />
  );
}
