import type { SubmitFunction } from '@sveltejs/kit';

/**
 * `use:enhance` that keeps what was typed once the answer comes (SvelteKit resets a form after a
 * successful post by default; a refused one shows its values from the server anyway).
 */
export const keepTyped: SubmitFunction =
	() =>
	async ({ update }) =>
		update({ reset: false });
