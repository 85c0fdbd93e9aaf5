import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	compilerOptions: {
		runes: true
	},
	kit: {
		adapter: adapter(),
		// Every page's Content-Security-Policy: scripts only from our origin or with this page's
		// nonce (SvelteKit adds it), never inline otherwise; no framing; forms post only to us, or
		// on to Stripe's hosted checkout after our own action redirects there. Styles allow
		// 'unsafe-inline' for the style attributes Svelte writes (drawings, transitions); no script
		// runs from a style. Other headers: src/lib/server/hooks/headers.ts.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self'],
				'manifest-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self', 'https://checkout.stripe.com'],
				'frame-ancestors': ['none']
			}
		},
		alias: {
			$mocks: 'mocks'
		}
	}
};

export default config;
