export * from './types';
export * from './elements';
export * from './radii';
export * from './validate';
export * from './checks';
export * from './merge';
export * from './wrap';
export * from './supercell';
