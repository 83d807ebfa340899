export * from './ability';
export * from './role-table';
