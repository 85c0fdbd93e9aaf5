/**
 * Flushline's estimating engine: from a site measure to quantities that can be bought, the
 * substrate checks and the prep they call for, prices in integer cents, and install duration.
 * Pure TypeScript (no framework, database, network or Node import): it runs in the browser for
 * live previews and on the server for stored results. Results are deterministic: the same
 * stored input (measure, settings and a copy of every price) gives the same result.
 *
 * Lengths in the input are inches (numbers); the app keeps the typed text separately and
 * parses it with `parseLength`.
 */
export type * from './types';
export * from './units';
export * from './geometry';
export * from './takeoff';
export * from './substrate';
export * from './pricing';
export * from './schedule';
export * from './settings';
export * from './prep';
export * from './cautions';
export * from './limits';
export * from './change-order';
export { estimate, forCustomer, forInstaller } from './estimate';
