import { useEffect, useState } from 'react';
import { usePathname, useRouter } from 'expo-router';

import { useSessionQuery } from '@/api/session';
import { AppShell } from '@/components/app-shell';
import { FullPageState } from '@/components/full-page-state';

export default function TabsLayout() {
  const session = useSessionQuery();
  // The address asked for, read before the navigator mounts: without its tabs the router falls back to '/'.
  const [intended] = useState(usePathname());
  const router = useRouter();
  const signedOut = session.isSuccess && !session.data;

  useEffect(() => {
    // Remember where the visitor was going, so signing in brings them back there.
    if (signedOut) router.replace(intended === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(intended)}`);
  }, [signedOut, intended, router]);

  if (session.isError) return <FullPageState error={session.error} onRetry={() => session.refetch()} />;
  if (!session.data) return <FullPageState message={signedOut ? 'Opening the sign-in page…' : 'Loading…'} />;
  return <AppShell />;
}
