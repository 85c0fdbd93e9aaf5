import { createDb, poolSize } from './client';

// process.env rather than $env, because the seed script and the integration tests share this
// module. The pool connects on first use; the server checks DATABASE_URL and DATABASE_POOL_MAX
// at start-up (hooks init).
export const { db, pool } = createDb(
	process.env.DATABASE_URL ?? '',
	poolSize(process.env.DATABASE_POOL_MAX)
);
export type { Db } from './client';
