export * from './organizations';
export * from './seed-runs';
