import { useLocalSearchParams } from 'expo-router';

import { NotFoundScreen } from '@/screens/library/not-found';
import { SpecificationScreen } from '@/screens/requirements/specification';

export default function SpecificationRoute() {
  const id = Number(useLocalSearchParams<{ id: string }>().id);
  return Number.isInteger(id) && id > 0 ? <SpecificationScreen id={id} /> : <NotFoundScreen what="specification" />;
}
