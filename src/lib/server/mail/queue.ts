import type { StoreWriteTx } from '../db/tenant';
import { enqueue, enqueueOutsideStore, MAIL_PURPOSES, type MailPurpose } from '../tasks';
import { inStore } from '../db/tenant';
import type { Mail } from './templates';

/**
 * Queues an e-mail of the store in the caller's transaction: it goes out once the change it tells
 * of has committed (never if it rolls back), is retried while the provider fails, and shows as
 * failed to the store's managers when the retries run out.
 */
export async function queueMail(
	tx: StoreWriteTx,
	purpose: MailPurpose,
	mail: Mail,
	about: { jobId?: string | null; createdBy?: string | null } = {}
) {
	return enqueue(
		tx,
		'mail',
		{ purpose, mail: { ...mail } },
		{ summary: `${MAIL_PURPOSES[purpose]} to ${mail.to}`, ...about }
	);
}

/**
 * Hands an e-mail of the sign-in (better-auth's callbacks) to the queue: an invitation is the
 * store's, in a transaction of its own; a password reset belongs to no store.
 */
export async function queueAuthMail(mail: Mail, storeId: string | null) {
	if (storeId) {
		await inStore(storeId, (tx) => queueMail(tx, 'invitation', mail));
	} else {
		await enqueueOutsideStore('mail', { purpose: 'password-reset', mail: { ...mail } });
	}
}
