import { PriceUpdateScreen } from '@/screens/library/prices';

export default function PricesRoute() {
  return <PriceUpdateScreen />;
}
