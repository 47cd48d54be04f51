import { LabImportScreen } from '@/screens/lab-import';

export default function LabImportRoute() {
  return <LabImportScreen />;
}
