import { useLocalSearchParams } from 'expo-router';

import { BatchSheetScreen } from '@/screens/batch-sheet';

export default function BatchSheetRoute() {
  const { versionId } = useLocalSearchParams<{ versionId: string }>();
  return <BatchSheetScreen versionId={Number(versionId) || 0} />;
}
