import { useLocalSearchParams } from 'expo-router';

import { NotFoundScreen } from '@/screens/library/not-found';
import { IngredientScreen } from '@/screens/library/ingredient';

export default function IngredientRoute() {
  const id = Number(useLocalSearchParams<{ id: string }>().id);
  return Number.isInteger(id) && id > 0 ? <IngredientScreen id={id} /> : <NotFoundScreen what="ingredient" />;
}
