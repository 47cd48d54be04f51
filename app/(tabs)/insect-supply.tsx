import { InsectSupplyScreen } from '@/screens/insect-supply';

export default function InsectSupplyRoute() {
  return <InsectSupplyScreen />;
}
