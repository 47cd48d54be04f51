import { RationCheckScreen } from '@/screens/ration-check';

export default function RationCheckRoute() {
  return <RationCheckScreen />;
}
