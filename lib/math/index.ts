export * from './vec3';
export * from './mat3';
export * from './cell';
export * from './frac';
export * from './cell-list';
