import { getRequestEvent } from '$app/server';
import { sveltekitCookies } from 'better-auth/svelte-kit';
import { config } from './config';
import { createAuth } from './create-auth';
import { db } from './db';
import { mailer } from './mail';

export const auth = createAuth({
	db,
	baseURL: config.origin,
	secret: config.authSecret || 'build-time-placeholder-secret-never-served',
	sendMail: mailer,
	plugins: [sveltekitCookies(getRequestEvent)]
});
