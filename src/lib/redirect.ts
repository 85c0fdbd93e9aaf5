/**
 * Where a redirect may go: only a path on our own origin. The target is parsed as a browser
 * would parse it against the origin, and anything that could leave the site goes home instead:
 * another origin (`https://evil.example`, `//evil.example`), a backslash (`/\evil.example`, which
 * browsers read as `//`), and control characters (`/\t/evil.example`: browsers drop tabs and line
 * breaks from URLs, so it becomes `//evil.example`). Browser-safe.
 */

/** An origin no real request has: relative targets are resolved against it when none is given. */
const PLACEHOLDER_ORIGIN = 'http://flushline.invalid';

// eslint-disable-next-line no-control-regex
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\\]/;

/**
 * The same-origin path (with query and hash) of `target`, or `fallback` when the target is
 * missing or could lead elsewhere. An absolute URL is kept only when it is on `origin`.
 */
export function safeRedirect(
	target: string | null | undefined,
	fallback = '/app',
	origin: string = PLACEHOLDER_ORIGIN
): string {
	if (!target || target.length > 2000 || UNSAFE.test(target)) return fallback;
	let base: URL;
	let url: URL;
	try {
		base = new URL(origin);
		url = new URL(target, base);
	} catch {
		return fallback;
	}
	if (url.origin !== base.origin) return fallback;
	// A relative target must be a path: `?x` or `page` would resolve against wherever we are.
	if (!target.startsWith('/') && !target.startsWith(base.origin + '/')) return fallback;
	const path = url.pathname + url.search + url.hash;
	// `/%2F%2Fevil` stays a path, but a path starting `//` would be read as another host.
	if (!path.startsWith('/') || path.startsWith('//')) return fallback;
	return path;
}
