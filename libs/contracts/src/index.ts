export * from './common';
export * from './roles';
export * from './auth';
export * from './shops';
