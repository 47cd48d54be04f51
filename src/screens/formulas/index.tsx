import { useLocalSearchParams } from 'expo-router';

import { useActiveMembership } from '@/api/session';

import { ApprovedFormulas } from './approved';
import { FormulaList } from './list';
import { FormulaWorkspace } from './workspace';

/**
 * The Formulas section. Planners see their formulas and open one in the workspace (?formula=id);
 * mill operators see only approved versions (?sheet=versionId opens one as a batch sheet).
 */
export function FormulasScreen() {
  const { formula, sheet } = useLocalSearchParams<{ formula?: string; sheet?: string }>();
  const { can } = useActiveMembership();
  if (!can('formulas:read')) return <ApprovedFormulas sheetId={sheet ? Number(sheet) : null} />;
  if (formula) return <FormulaWorkspace id={Number(formula)} />;
  return <FormulaList />;
}
