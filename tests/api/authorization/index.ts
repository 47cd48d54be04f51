// Every area's table of routes and expected answers. A new area adds one line here.
export { accountsRules } from './accounts.rules';
export { formulationRules } from './formulation.rules';
export { formulasRules } from './formulas.rules';
export { supplyRules } from './supply.rules';
export { labImportsRules } from './lab-imports.rules';
export { libraryRules } from './library.rules';
export { outputsRules } from './outputs.rules';
