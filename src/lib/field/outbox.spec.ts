// The phone's outbox against an in-memory IndexedDB (fake-indexeddb) and a scripted server:
// nothing leaves the queue until the server has it, a 401 keeps everything ("sign in to send"),
// a conflict is kept to show, a refused photo stays on the phone to retry or delete.
import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { flush, itemsOf, photosOf, saveItem, savePhoto, waitingCount } from './outbox';

const at = '2026-12-02T09:00:00.000Z';

function item(jobId: string, clientId: string, qty: number) {
	return saveItem({
		clientId,
		jobId,
		input: {
			clientId,
			kind: 'found',
			roomId: 'r1',
			refKey: 'prep:hole_repair',
			qty,
			note: '',
			deleted: false,
			recordedAt: at
		},
		state: 'waiting',
		savedAt: Date.now()
	});
}

function photo(jobId: string, clientId: string) {
	return savePhoto({
		clientId,
		jobId,
		blob: new Blob([new Uint8Array([1, 2, 3])], { type: 'image/jpeg' }),
		purpose: 'report',
		roomId: 'r1',
		itemClientId: null,
		caption: '',
		takenAt: at,
		state: 'waiting',
		savedAt: Date.now()
	});
}

const json = (body: unknown, status = 200) =>
	new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

describe('the outbox', () => {
	it('keeps everything when the network is down or the session ended', async () => {
		await item('job-a', 'item-a-000001', 2);
		await photo('job-a', 'photo-a-00001');
		const offline = await flush('job-a', async () => {
			throw new TypeError('Failed to fetch');
		});
		expect(offline).toEqual({ sent: 0, signIn: false, offline: true });
		const expired = await flush('job-a', async () => json({ message: 'Sign in first' }, 401));
		expect(expired.signIn).toBe(true);
		expect((await itemsOf('job-a')).map((i) => i.state)).toEqual(['waiting']);
		expect((await photosOf('job-a')).map((p) => p.state)).toEqual(['waiting']);
		expect(await waitingCount()).toBe(2);
	});

	it('marks what the server took as sent, keeps a conflict, and keeps a refused photo', async () => {
		await item('job-b', 'item-b-000001', 3);
		await item('job-b', 'item-b-000002', 1);
		await photo('job-b', 'photo-b-00001');
		const sent: string[] = [];
		const result = await flush('job-b', async (url, init) => {
			sent.push(String(url));
			if (String(url).endsWith('/items')) {
				const body = JSON.parse(String(init?.body)) as { items: { clientId: string }[] };
				expect(body.items.map((i) => i.clientId)).toEqual(['item-b-000001', 'item-b-000002']);
				const stored = { kind: 'found', roomId: 'r1', refKey: 'prep:hole_repair', unit: 'each' };
				return json({
					items: [
						{
							clientId: 'item-b-000001',
							status: 'stored',
							item: { ...stored, clientId: 'item-b-000001', qty: 3, version: 1 }
						},
						{
							clientId: 'item-b-000002',
							status: 'conflict',
							message: 'Changed on another phone',
							item: { ...stored, clientId: 'item-b-000002', qty: 4, version: 2 }
						}
					]
				});
			}
			return json({ message: 'That file is not a photo we can take' }, 415);
		});
		// Items go before photos (a photo may name an item).
		expect(sent).toEqual(['/api/v1/field/jobs/job-b/items', '/api/v1/field/jobs/job-b/photos']);
		expect(result.sent).toBe(1);
		const items = await itemsOf('job-b');
		expect(items.find((i) => i.clientId === 'item-b-000001')?.state).toBe('sent');
		const conflict = items.find((i) => i.clientId === 'item-b-000002');
		expect(conflict).toMatchObject({ state: 'conflict', server: { qty: 4, version: 2 } });
		// The phone's own amount is kept beside the other phone's, for the installer to choose.
		expect(conflict?.input).toMatchObject({ qty: 1 });
		const [refused] = await photosOf('job-b');
		expect(refused).toMatchObject({
			state: 'refused',
			message: expect.stringMatching(/not a photo/)
		});
	});

	it('keeps what the server could not take now (a restart, a busy balancer) and sends it later, once', async () => {
		await item('job-c', 'item-c-000001', 2);
		await photo('job-c', 'photo-c-00001');
		// The database restarting: the items' send is answered 503, nothing is marked.
		for (const status of [503, 502, 500, 504, 429]) {
			const busy = await flush('job-c', async () =>
				json({ message: 'Please try again in a moment' }, status)
			);
			expect(busy, String(status)).toEqual({ sent: 0, signIn: false, offline: true });
			expect((await itemsOf('job-c')).map((i) => i.state)).toEqual(['waiting']);
			expect((await photosOf('job-c')).map((p) => p.state)).toEqual(['waiting']);
		}
		// The items go through, then the photo's send is cut and then answered 503: still waiting.
		const stored = { kind: 'found', roomId: 'r1', refKey: 'prep:hole_repair', qty: 2, version: 1 };
		const itemsTaken = async (url: RequestInfo | URL) => {
			if (!String(url).endsWith('/items')) throw new Error('unexpected');
			return json({
				items: [
					{
						clientId: 'item-c-000001',
						status: 'stored',
						item: { ...stored, clientId: 'item-c-000001' }
					}
				]
			});
		};
		const cut = await flush('job-c', async (url, init) => {
			if (String(url).endsWith('/items')) return itemsTaken(url);
			void init;
			throw new TypeError('network error: connection reset');
		});
		expect(cut).toEqual({ sent: 1, signIn: false, offline: true });
		const busy = await flush('job-c', async () => json({ message: 'try again' }, 503));
		expect(busy.offline).toBe(true);
		expect((await photosOf('job-c')).map((p) => p.state)).toEqual(['waiting']);
		// The server is back: the photo is sent once and marked with the server's id.
		const photoSends: string[] = [];
		const back = await flush('job-c', async (url, init) => {
			photoSends.push((init?.body as FormData).get('clientId') as string);
			return json({ id: 'photo-server-1', clientId: 'photo-c-00001', duplicate: false }, 201);
		});
		expect(back).toEqual({ sent: 1, signIn: false, offline: false });
		expect(photoSends).toEqual(['photo-c-00001']);
		expect(await photosOf('job-c')).toMatchObject([{ state: 'sent', serverId: 'photo-server-1' }]);
		// Nothing is left to send again.
		const after = await flush('job-c', async () => {
			throw new Error('nothing should be sent');
		});
		expect(after).toEqual({ sent: 0, signIn: false, offline: false });
	});
});
