import { SpeciesScreen } from '@/screens/requirements/species';

export default function SpeciesRoute() {
  return <SpeciesScreen />;
}
