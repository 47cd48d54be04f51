/** Reading lab analysis files: see preview.ts for the whole pipeline. */
export * from './types';
export * from './csv';
export * from './numbers';
export * from './words';
export * from './table';
export * from './estimate';
export * from './preview';
