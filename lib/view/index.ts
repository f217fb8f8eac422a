export * from './axes';
export * from './slab';
export * from './pick';
export * from './bonds';
export * from './palette';
export * from './impostor';
export * from './lattice2';
export * from './unwrap-tile';
