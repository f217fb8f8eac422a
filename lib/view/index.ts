export * from './vec';
export * from './axes';
export * from './slab';
export * from './pick';
export * from './neighbours';
export * from './palette';
export * from './impostor';
