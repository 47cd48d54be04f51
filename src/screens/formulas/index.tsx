import { useLocalSearchParams } from 'expo-router';

import { useActiveMembership } from '@/api/session';

import { ApprovedFormulas } from './approved';
import { FarmHome } from './farm-home';
import { FormulaList } from './list';
import { FormulaWorkspace } from './workspace';

/**
 * The Formulas section, by role: planners see their formulas and open one in the workspace (?formula=id);
 * mill operators see only approved versions, each opening as a batch sheet; farm members check rations
 * and read what was shared with them.
 */
export function FormulasScreen() {
  const { formula } = useLocalSearchParams<{ formula?: string }>();
  const { can } = useActiveMembership();
  if (can('formulas:read')) return formula ? <FormulaWorkspace id={Number(formula)} /> : <FormulaList />;
  if (can('formulas:read-approved')) return <ApprovedFormulas />;
  return <FarmHome />;
}
