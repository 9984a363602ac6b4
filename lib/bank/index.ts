export * from './types';
export * from './network';
export * from './discharge';
export * from './preferred-values';
export * from './balancing';
export * from './arrangement-search';
export * from './bounds';
