export * from './hyperlattice';
