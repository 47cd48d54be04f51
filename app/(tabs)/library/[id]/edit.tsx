import { useLocalSearchParams } from 'expo-router';

import { IngredientFormScreen } from '@/screens/library/ingredient-form';
import { NotFoundScreen } from '@/screens/library/not-found';

export default function EditIngredientRoute() {
  const id = Number(useLocalSearchParams<{ id: string }>().id);
  return Number.isInteger(id) && id > 0 ? <IngredientFormScreen id={id} /> : <NotFoundScreen what="ingredient" />;
}
