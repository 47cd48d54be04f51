import { RequirementsScreen } from '@/screens/requirements';

export default function RequirementsRoute() {
  return <RequirementsScreen />;
}
