export * from './types';
export * from './elements';
export * from './validate';
export * from './checks';
export * from './merge';
