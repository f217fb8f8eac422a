export * from './model';
export * from './chain';
export * from './icosahedral';
export * from './decoration';
export * from './planar';
export * from './decagonal';
export * from './diffraction';
