import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { SvelteKitPWA } from '@vite-pwa/sveltekit';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';

/**
 * The browser's build takes polygon-clipping's ES module build, as the server's takes its
 * CommonJS one: the package's `browser` field names a UMD bundle with an older splaytree inlined,
 * 1.3 KB gzip more on every page that runs the engine (the measure page, the calculators).
 */
const polygonClippingModule: Plugin = {
	name: 'flushline:polygon-clipping-module',
	apply: 'build',
	enforce: 'pre',
	applyToEnvironment: (environment) => environment.name === 'client',
	resolveId(id, importer, options) {
		if (id !== 'polygon-clipping') return null;
		return this.resolve('polygon-clipping/dist/polygon-clipping.esm.js', importer, {
			...options,
			skipSelf: true
		});
	}
};

export default defineConfig({
	plugins: [
		polygonClippingModule,
		tailwindcss(),
		sveltekit(),
		// The installer's screens work with no signal: a service worker scoped to /field keeps the
		// app's files and, network first, the field pages and their data as last seen; the desk is
		// outside its scope and never served from it. Drafts live in IndexedDB ($lib/field/outbox).
		SvelteKitPWA({
			strategies: 'generateSW',
			registerType: 'autoUpdate',
			injectRegister: false,
			scope: '/field/',
			manifest: false,
			workbox: {
				navigateFallback: undefined,
				cleanupOutdatedCaches: true,
				// A new worker takes over open field pages at once (they keep no state in it).
				clientsClaim: true,
				skipWaiting: true,
				// Wakes the open field page to send its outbox (Background Sync, where supported).
				importScripts: ['/field-sync.js'],
				runtimeCaching: [
					{
						urlPattern: ({ url, request }) =>
							request.method === 'GET' &&
							(url.pathname === '/field' || url.pathname.startsWith('/field/')) &&
							!url.pathname.endsWith('.pdf'),
						handler: 'NetworkFirst',
						options: {
							cacheName: 'field-pages',
							networkTimeoutSeconds: 6,
							// The page's data is asked with SvelteKit's `x-sveltekit-invalidated` query.
							matchOptions: { ignoreSearch: true },
							expiration: { maxEntries: 200, maxAgeSeconds: 14 * 86_400 }
						}
					},
					{
						urlPattern: ({ url }) =>
							/^\/api\/v1\/field\/jobs\/[^/]+\/photos\/[^/]+$/.test(url.pathname),
						handler: 'CacheFirst',
						options: {
							cacheName: 'field-photos',
							expiration: { maxEntries: 300, maxAgeSeconds: 14 * 86_400 }
						}
					}
				]
			}
		})
	],
	build: {
		rollupOptions: {
			// Vite 8 prints a plugin timing report on every build; it is noise for `npm start`.
			onLog(level, log, handler) {
				if (log.code !== 'PLUGIN_TIMINGS') handler(level, log);
			}
		}
	},
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					// Several specs run whole calculators or the OpenAPI document; on a busy 2-core
					// machine the 5 s default failed them for the load, not for the code.
					testTimeout: 20000,
					include: ['src/**/*.spec.ts', 'mocks/**/*.spec.ts'],
					exclude: ['src/**/*.db.spec.ts']
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['src/**/*.db.spec.ts', 'tests/integration/**/*.spec.ts'],
					fileParallelism: false,
					setupFiles: ['tests/integration/setup.ts'],
					testTimeout: 20000,
					hookTimeout: 20000
				}
			},
			{
				// The production build (`node build`) started with chosen settings, sent real requests;
				// `npm test` runs it after the build.
				extends: './vite.config.ts',
				test: {
					name: 'server',
					environment: 'node',
					include: ['tests/server/**/*.spec.ts'],
					fileParallelism: false,
					testTimeout: 30000,
					hookTimeout: 60000
				}
			}
		]
	}
});
