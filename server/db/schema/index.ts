// Every table, one module per area; drizzle.config.ts reads this file.
export * from './auth';
export * from './datasets';
export * from './fits';
export * from './releases';
export * from './consumers';
