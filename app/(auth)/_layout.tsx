import { Redirect, Slot, usePathname } from 'expo-router';

import { useSessionQuery } from '@/api/session';

// Pages that make sense whoever is signed in; the others send a signed-in person to the app.
const OPEN_TO_ALL = ['/invitation', '/reset-password'];

export default function AuthLayout() {
  const session = useSessionQuery();
  const pathname = usePathname();
  if (session.data && !OPEN_TO_ALL.includes(pathname)) return <Redirect href="/" />;
  return <Slot />;
}
