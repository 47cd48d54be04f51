export * from './organizations';
export * from './seed-runs';
export * from './accounts';
export * from './library';
export * from './requirements';
export * from './formulas';
export * from './supply';
export * from './lab-imports';
