export * from './gtin.ts';
export * from './money.ts';
export * from './energy.ts';
export * from './bom-rules.ts';
export * from './planner.ts';
export * from './csv-safety.ts';
