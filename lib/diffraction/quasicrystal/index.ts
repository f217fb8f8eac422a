export * from './star';
export * from './domain-transform';
export * from './structure-factor';
export * from './powder';
export * from './least-squares';
export * from './fit';
export * from './peak-find';
export * from './index-icosahedral';
