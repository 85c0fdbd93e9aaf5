import { config } from '$lib/server/config';
import { linksOf, readOutbox } from '$mocks/outbox';
import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

// Only while the e-mail fake is on: with a real Resend key this page does not exist.
export const load: PageServerLoad = async () => {
	if (!config.fakeMail) error(404, 'Not found');
	return {
		messages: readOutbox(config.dataDir).map((m) => ({ ...m, links: linksOf(m) }))
	};
};
