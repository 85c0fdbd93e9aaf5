import { getRequestEvent } from '$app/server';
import { sveltekitCookies } from 'better-auth/svelte-kit';
import { config } from './config';
import { createAuthLimits } from './auth-limits';
import { createAuth } from './create-auth';
import { db, pool } from './db';
import { queueAuthMail } from './mail/queue';

export const auth = createAuth({
	db,
	baseURL: config.origin,
	secret: config.authSecret || 'build-time-placeholder-secret-never-served',
	sendMail: queueAuthMail,
	limits: createAuthLimits(pool, config.authLimits),
	plugins: [sveltekitCookies(getRequestEvent)]
});
