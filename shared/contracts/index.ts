export * from './auth';
export * from './profile';
export * from './labs';
export * from './admin';
export * from './errors';
export * from './depositing';
export * from './access';
export * from './billing';
