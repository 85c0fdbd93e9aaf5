import { config } from '$lib/server/config';
import { attachmentText, linksOf, readOutbox } from '$mocks/outbox';
import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

// Only while the e-mail fake is on: with a real Resend key this page does not exist.
export const load: PageServerLoad = async () => {
	if (!config.fakeMail) error(404, 'Not found');
	return {
		messages: readOutbox(config.dataDir).map((m) => ({
			...m,
			links: linksOf(m),
			// Files are shown as text (calendar files), with a link that downloads them.
			attachments: (m.attachments ?? []).map((a) => ({
				filename: a.filename,
				contentType: a.contentType,
				text: a.contentType.startsWith('text/') ? attachmentText(a) : null,
				href: `data:${a.contentType};base64,${a.content}`
			}))
		}))
	};
};
