import { IngredientFormScreen } from '@/screens/library/ingredient-form';

export default function NewIngredientRoute() {
  return <IngredientFormScreen />;
}
