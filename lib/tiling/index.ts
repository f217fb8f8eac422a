export * from './hyperlattice';
export * from './continued-fraction';
export * from './fibonacci';
