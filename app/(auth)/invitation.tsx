import { InvitationScreen } from '@/screens/auth/invitation';

export default function InvitationRoute() {
  return <InvitationScreen />;
}
