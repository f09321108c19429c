export * from './supplier';
export * from './app-user';
export * from './audit-event';
export * from './session';
export * from './part';
export * from './gauge';
export * from './plan';
export * from './lot';
