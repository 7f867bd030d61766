export * from './orgs';
export * from './catalog';
export * from './fleet';
export * from './sharing';
export * from './inspections';
export * from './parts';
export * from './classroom';
export * from './audit';
