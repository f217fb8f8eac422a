export * from './min-distance';
export * from './composition';
export * from './density';
export * from './shells';
export * from './point-group';
export * from './weights';
