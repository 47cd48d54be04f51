import type { ReactNode } from 'react';
import { Redirect } from 'expo-router';

import { useSessionQuery } from '@/api/session';
import { FullPageState } from '@/components/full-page-state';
import { MeasuresGate } from '@/components/measures-gate';

/** Pages outside the sections: loading, or to sign-in and back here, or the page in the organization's units. */
export function SignedInGate({ path, children }: { path: string; children: ReactNode }) {
  const session = useSessionQuery();
  if (session.isError) return <FullPageState error={session.error} onRetry={() => session.refetch()} />;
  if (!session.isSuccess) return <FullPageState message="Loading…" />;
  if (!session.data) return <Redirect href={`/sign-in?next=${encodeURIComponent(path)}`} />;
  return <MeasuresGate>{children}</MeasuresGate>;
}
