export * from './organizations';
export * from './seed-runs';
export * from './accounts';
