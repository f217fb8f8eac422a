export * from './hyperlattice';
export * from './continued-fraction';
export * from './fibonacci';
export * from './window';
export * from './icosahedral';
export * from './approximant';
export * from './decorate';
