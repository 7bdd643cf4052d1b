export * from './auth';
export * from './shop';
