export * from './model';
export * from './chain';
