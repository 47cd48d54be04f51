import { LabAnalysesHistoryScreen } from '@/screens/lab-import/history';

export default function LabAnalysesHistoryRoute() {
  return <LabAnalysesHistoryScreen />;
}
