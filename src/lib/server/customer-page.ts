import { error } from '@sveltejs/kit';
import { config } from './config';
import { signLink, verifyLink } from './customer-link';
import * as jobs from './db/queries/jobs';
import { readStore } from './db/queries/stores';
import type { StoreTx } from './db/tenant';

/** How long a customer's link works; every e-mail carries a fresh one. */
export const LINK_DAYS = 90;

/** The customer's link to a job: `/c/<token>`, signed with the job's link version, expiring. */
export function signedLink(
	storeId: string,
	job: { id: string; linkVersion: number },
	now = new Date()
) {
	const token = signLink(
		{
			storeId,
			jobId: job.id,
			version: job.linkVersion,
			expiresAt: new Date(now.getTime() + LINK_DAYS * 86_400_000)
		},
		config.authSecret
	);
	return `${config.origin}/c/${token}`;
}

/** The customer's current link to a job of the transaction's store. */
export async function customerLink(tx: StoreTx, jobId: string, now = new Date()) {
	const linkVersion = (await jobs.linkVersion(tx, jobId)) ?? 1;
	return signedLink(tx.storeId, { id: jobId, linkVersion }, now);
}

const NOT_VALID =
	'This link is not valid. Check that it was copied whole, or ask the store for a new one.';

/**
 * The store and job a customer's link names, or the page that says the link cannot be used.
 * Nothing is read from the database here: the signature and expiry are checked first.
 */
export function openLink(token: string) {
	const link = verifyLink(token, config.authSecret);
	if (!link.ok) {
		if (link.reason === 'expired') {
			error(410, 'This link has expired. Ask the store that sent it for a new one.');
		}
		error(404, NOT_VALID);
	}
	return {
		storeId: link.storeId,
		jobId: link.jobId,
		expiresAt: link.expiresAt,
		version: link.version ?? 1
	};
}

const WITHDRAWN =
	'This link was replaced or withdrawn by the store. Ask the store that sent it for a new one.';

/**
 * The store and the job of an opened link, in the store's transaction; 404 when either is gone,
 * 410 when the store has since replaced or withdrawn the link (its version is older).
 */
export async function linkedJob(tx: StoreTx, link: { jobId: string; version?: number }) {
	const store = await readStore(tx);
	const job = store ? await jobs.readForStore(tx, link.jobId) : undefined;
	if (!store || !job) error(404, NOT_VALID);
	if ((link.version ?? 1) !== (await jobs.linkVersion(tx, job.id))) error(410, WITHDRAWN);
	return { store, job };
}
