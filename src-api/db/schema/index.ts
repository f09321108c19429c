export * from './supplier';
export * from './app-user';
export * from './audit-event';
export * from './session';
