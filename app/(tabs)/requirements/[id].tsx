import { useLocalSearchParams } from 'expo-router';

import { NotFoundScreen } from '@/screens/library/not-found';
import { SpecificationScreen } from '@/screens/requirements/specification';

export default function SpecificationRoute() {
  const params = useLocalSearchParams<{ id: string; adjust?: string }>();
  const id = Number(params.id);
  return Number.isInteger(id) && id > 0 ? <SpecificationScreen id={id} adjust={params.adjust === '1'} /> : <NotFoundScreen what="specification" />;
}
