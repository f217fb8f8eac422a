export * from './types';
export * from './elements';
export * from './cell';
export * from './validate';
export * from './neighbors';
export * from './checks';
export * from './merge';
