export * from './auth.ts';
export * from './companies.ts';
export * from './catalogue.ts';
export * from './stock.ts';
export * from './plans.ts';
export * from './jobs.ts';
export * from './purchasing.ts';
