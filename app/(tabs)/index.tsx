import { FormulasScreen } from '@/screens/formulas';

export default function FormulasRoute() {
  return <FormulasScreen />;
}
