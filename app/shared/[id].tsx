import { useLocalSearchParams } from 'expo-router';

import { SharedResultScreen } from '@/screens/shared-result';

export default function SharedResultRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <SharedResultScreen token={id ?? ''} />;
}
