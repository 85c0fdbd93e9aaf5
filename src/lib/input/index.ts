/**
 * One way to read what people type, for every form, calculator and route, in the browser and on
 * the server: numbers (`./number`: the comma rule), money and percentages (`./money`: the
 * currency's own decimals), lengths, areas and volumes (`./length`), nested form fields and the
 * guard for keys a user chose (`./fields`), JSON from outside (`./json`), and the same readers as
 * zod fields (`./zod`).
 */
export * from './number';
export * from './money';
export * from './length';
export * from './fields';
export * from './json';
export * from './zod';
