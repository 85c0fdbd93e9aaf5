// Numbers that come in an address or a hidden field (a quote's version, a measure's base
// version) are read by the one number rule with a bound, so `abc`, `1.5` or a number past what
// PostgreSQL's integer holds is a 4xx, never a database error (500).
import { isActionFailure, isHttpError, type RequestEvent } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { emptyRoom } from '$lib/measure/draft';
import { makeJob, makeStore, memberEvent, type Member, type TestStore } from './factories';

let current: RequestEvent | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));

const quotePdf = await import('../../src/routes/app/jobs/[id]/quote/[version]/pdf/+server');
const quotePage = await import('../../src/routes/app/jobs/[id]/quote/+page.server');
const measurePage = await import('../../src/routes/app/jobs/[id]/measure/+page.server');
const apiMeasure = await import('../../src/routes/api/v1/jobs/[id]/measure/+server');

const NOT_NUMBERS = ['abc', '1.5', '0', '-1', '1e3', '99999999999', '1,5'];

/** The status an answer or a thrown `error()` carries. */
async function statusOf(run: () => unknown): Promise<number> {
	try {
		const answer = await run();
		if (answer instanceof Response) return answer.status;
		if (isActionFailure(answer)) return answer.status;
		return 200;
	} catch (e) {
		if (isHttpError(e)) return e.status;
		throw e;
	}
}

let store: TestStore;
let owner: Member;
beforeAll(async () => {
	store = await makeStore('Address Floors');
	owner = { user: store.owner, role: 'owner', store };
});

describe('a quote version in the address', () => {
	it('is 404 when it is not a whole version number (was a 500 from PostgreSQL)', async () => {
		const job = await makeJob(store.id, store.owner.id);
		for (const version of NOT_NUMBERS) {
			const path = `/app/jobs/${job.id}/quote/${version}/pdf`;
			current = memberEvent(owner, path, { id: job.id, version });
			const status = await statusOf(() =>
				quotePdf.GET(current as Parameters<typeof quotePdf.GET>[0])
			);
			expect(status, version).toBe(404);
			const page = `/app/jobs/${job.id}/quote?v=${encodeURIComponent(version)}`;
			current = memberEvent(owner, page, { id: job.id });
			const load = () => quotePage.load(current as Parameters<typeof quotePage.load>[0]);
			expect(await statusOf(load), `?v=${version}`).toBe(404);
		}
	});
});

describe('a measure’s base version', () => {
	it('past what PostgreSQL’s integer holds is a 400, in the form and in the API', async () => {
		const job = await makeJob(store.id, store.owner.id);
		const draft = { builtYear: '', rooms: [emptyRoom('r1', 'Hall')] };
		const form = new FormData();
		form.append('baseVersion', '99999999999');
		form.append('_draft', JSON.stringify(draft));
		current = memberEvent(
			owner,
			`/app/jobs/${job.id}/measure`,
			{ id: job.id },
			{
				method: 'POST',
				body: form
			}
		);
		const save = measurePage.actions.save as (e: RequestEvent) => unknown;
		expect(await statusOf(() => save(current!))).toBe(400);

		current = memberEvent(
			owner,
			`/api/v1/jobs/${job.id}/measure`,
			{ id: job.id },
			{
				method: 'PUT',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify({ baseVersion: 99_999_999_999, draft })
			}
		);
		const put = apiMeasure.PUT as (e: RequestEvent) => Promise<Response>;
		expect(await statusOf(() => put(current!))).toBe(400);
	});
});
