/**
 * One way to read what people type, for every form, calculator and route, in the browser and on
 * the server: numbers (`./number`: the comma rule), money and percentages (`./money`: the
 * currency's own decimals), lengths, areas and volumes (`./length`), nested form fields and the
 * guard for keys a user chose (`./fields`) and JSON from outside (`./json`). The same readers as
 * zod fields are `$lib/input/zod`, imported by that path: its fields are built when the module
 * loads, so re-exported here they would put zod classic on every page that reads a number.
 */
export * from './number';
export * from './money';
export * from './length';
export * from './fields';
export * from './json';
