import { createDb } from './client';

// process.env rather than $env, because the seed script and the integration tests share this
// module. The pool connects on first use; the server checks DATABASE_URL at start-up (hooks init).
export const { db, pool } = createDb(process.env.DATABASE_URL ?? '');
export type { Db } from './client';
