import { DevMailScreen } from '@/screens/dev-mail';

export default function DevMailRoute() {
  return <DevMailScreen />;
}
