import type { RequestHandler } from './$types';

/**
 * The load balancer's health check (README, "Deploying on several servers"): this process is up
 * and answering. It reads no session, no store and no database, so it stays cheap at a check a
 * second, and a database hiccup never takes every server out of the balancer at once.
 */
export const GET: RequestHandler = () =>
	new Response('ok\n', {
		headers: { 'content-type': 'text/plain; charset=utf-8', 'cache-control': 'no-store' }
	});
