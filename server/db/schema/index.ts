// Every table, re-exported so drizzle-kit and the auth adapter see them all.
export * from './auth';
export * from './depositing';
export * from './access';
export * from './storage';
export * from './billing';
export * from './lab-profiles';
export * from './catalogue';
export * from './comparisons';
