import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
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
