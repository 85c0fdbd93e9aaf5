import { error } from '@sveltejs/kit';
import { config } from './config';
import { verifyLink } from './customer-link';
import * as jobs from './db/queries/jobs';
import { WHOLE_STORE } from './db/queries/access';
import { readStore } from './db/queries/stores';

/**
 * The store and job a customer's link names, or the page that says the link cannot be used.
 * No data of the job is read before the signature and expiry check pass.
 */
export async function resolveLink(token: string) {
	const link = verifyLink(token, config.authSecret);
	if (!link.ok) {
		if (link.reason === 'expired') {
			error(410, 'This link has expired. Ask the store that sent it for a new one.');
		}
		error(
			404,
			'This link is not valid. Check that it was copied whole, or ask the store for a new one.'
		);
	}
	const [store, job] = await Promise.all([
		readStore(link.storeId),
		jobs.read(link.storeId, link.jobId, WHOLE_STORE)
	]);
	if (!store || !job)
		error(
			404,
			'This link is not valid. Check that it was copied whole, or ask the store for a new one.'
		);
	return { store, job, expiresAt: link.expiresAt };
}
