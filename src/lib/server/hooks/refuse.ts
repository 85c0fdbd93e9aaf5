import { json, type RequestEvent } from '@sveltejs/kit';

function escapeHtml(text: string) {
	return text.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);
}

const TITLES: Record<number, string> = {
	400: 'This request could not be read',
	404: 'Not found',
	413: 'That is too large',
	429: 'Too many attempts',
	503: 'Please try again in a moment'
};

/**
 * A refusal answered by a hook, before any route runs, in the form the caller reads: JSON with
 * the bad field's path for the API, SvelteKit's action result for a form sent with `use:enhance`
 * (the page then shows its error page), and a small readable page for a plain form post or link.
 */
export function refuseRequest(
	event: RequestEvent,
	status: number,
	message: string,
	options: { path?: string; headers?: Record<string, string> } = {}
): Response {
	const headers = options.headers ?? {};
	if (event.url.pathname.startsWith('/api/')) {
		const issues = options.path ? [{ path: options.path, message }] : [];
		return json({ message, issues }, { status, headers });
	}
	if (event.isDataRequest) return json({ message }, { status, headers });
	if (event.request.headers.get('x-sveltekit-action') === 'true') {
		return json({ type: 'error', error: { message } }, { status, headers });
	}
	const title = TITLES[status] ?? 'This request was refused';
	const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>body{margin:0;font-family:system-ui,sans-serif;background:#faf8f4;color:#26323d}main{max-width:36rem;margin:4rem auto;padding:0 1.5rem}h1{font-size:1.5rem}a{color:#8a4f1f}</style>
</head><body><main><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p><p><a href="/">Back to the front page</a></p></main></body></html>`;
	return new Response(html, {
		status,
		headers: {
			'content-type': 'text/html; charset=utf-8',
			'content-security-policy':
				"default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'",
			...headers
		}
	});
}
