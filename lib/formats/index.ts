export * from './errors';
export * from './number';
export * from './xyz';
export * from './json';
export * from './extxyz';
