export * from './axes';
export * from './order';
export * from './points';
export * from './states';
export * from './prediction';
export * from './solve-job';
export * from './solve-poses';
