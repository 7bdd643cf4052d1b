export * from './auth';
export * from './shop';
export * from './limits';
export * from './storage';
