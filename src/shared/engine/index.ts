/**
 * Troughline's least-cost formulation engine. Pure TypeScript: no framework or Node
 * imports, so the server, the command line, the tests and the app share it.
 *
 * - {@link solveFormula}: least-cost mix with shadow prices, price ranging and, when no mix
 *   exists, the cheapest relaxation.
 * - {@link evaluateMix}: levels, cost and missed bounds of a given mix.
 * - {@link allocate}: several formulas from shared limited stocks.
 * - {@link priceSweep}: cost and inclusion over a range of one ingredient's price.
 * The JSON formats are in src/shared/schemas/formulation.ts and README.md beside this file.
 */
export { solveFormula, solveModel, parseFormulaProblem, DEFAULT_TOLERANCE, type EngineOptions } from './formulate';
export { evaluateMix } from './evaluate';
export { allocate, buildAllocationModel, DIRECT_FORMULA_LIMIT, type AllocationOptions, type AllocationModel } from './allocate';
export { priceSweep } from './price-sweep';
export { buildFormulaModel, type FormulaModel } from './formula-model';
export { simplexJs, createSimplexJsModel, type SimplexJsModel } from './simplex-js';
export { maxScaledViolation, rowActivity, type LinearProgram, type LpOutcome, type LpSolver, type LpSolveOptions } from './lp-types';
