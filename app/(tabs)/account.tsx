import { AccountScreen } from '@/screens/account';

export default function AccountRoute() {
  return <AccountScreen />;
}
