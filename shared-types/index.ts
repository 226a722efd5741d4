export * from './domain.ts';
export * from './host-api.ts';
export * from './import.ts';
