import { AppShell } from '@/components/app-shell';

export default function TabsLayout() {
  return <AppShell />;
}
