import { LibraryScreen } from '@/screens/library';

export default function LibraryRoute() {
  return <LibraryScreen />;
}
