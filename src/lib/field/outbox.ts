/**
 * The phone's outbox: every item and photo of the field report is written to IndexedDB the
 * moment it is typed or taken, and sent from there when the network lets it. Each carries the id
 * the phone made for it (`clientId`), so a resend is stored once. A 401 (the session ended while
 * offline) keeps everything and says "sign in to send"; a stale edit comes back as a conflict to
 * show the installer, never applied.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { FieldItemInput } from '$lib/schemas/field';

/** An item as the server keeps it (see `PhoneItem` in $lib/server/field/report). */
export interface ServerItem {
	clientId: string;
	kind: 'found' | 'reading' | 'note';
	roomId: string | null;
	refKey: string | null;
	qty: number | null;
	unit: string | null;
	readingKind: string | null;
	reading: unknown;
	note: string;
	version: number;
	deleted: boolean;
	recordedAt: string;
}

export type ItemState = 'waiting' | 'sent' | 'conflict' | 'refused';

export interface OutboxItem {
	clientId: string;
	jobId: string;
	/** What the phone says, as it is sent (with `baseVersion` for an edit). */
	input: FieldItemInput;
	state: ItemState;
	/** The server's copy: after a send, or the other phone's in a conflict. */
	server?: ServerItem;
	message?: string;
	savedAt: number;
}

export interface OutboxPhoto {
	clientId: string;
	jobId: string;
	blob: Blob;
	purpose: 'report' | 'completion';
	roomId: string | null;
	itemClientId: string | null;
	caption: string;
	takenAt: string;
	state: 'waiting' | 'sent' | 'refused';
	message?: string;
	serverId?: string;
	savedAt: number;
}

interface OutboxDb extends DBSchema {
	items: { key: string; value: OutboxItem; indexes: { job: string } };
	photos: { key: string; value: OutboxPhoto; indexes: { job: string } };
}

let opened: Promise<IDBPDatabase<OutboxDb>> | undefined;

function db() {
	opened ??= openDB<OutboxDb>('flushline-field', 1, {
		upgrade(d) {
			d.createObjectStore('items', { keyPath: 'clientId' }).createIndex('job', 'jobId');
			d.createObjectStore('photos', { keyPath: 'clientId' }).createIndex('job', 'jobId');
		}
	});
	return opened;
}

export const newClientId = () => crypto.randomUUID();

export async function saveItem(item: OutboxItem) {
	await (await db()).put('items', item);
}

export async function savePhoto(photo: OutboxPhoto) {
	await (await db()).put('photos', photo);
}

export async function removePhoto(clientId: string) {
	await (await db()).delete('photos', clientId);
}

export async function itemsOf(jobId: string) {
	return (await db()).getAllFromIndex('items', 'job', jobId);
}

export async function photosOf(jobId: string) {
	return (await db()).getAllFromIndex('photos', 'job', jobId);
}

/** How many items and photos are still to send, on every job. */
export async function waitingCount(): Promise<number> {
	const d = await db();
	const items = await d.getAll('items');
	const photos = await d.getAll('photos');
	return (
		items.filter((i) => i.state === 'waiting').length +
		photos.filter((p) => p.state === 'waiting').length
	);
}

export type FlushResult = { sent: number; signIn: boolean; offline: boolean };

/**
 * An answer that says "not now" rather than "not this": the server or something before it is
 * down or busy (500, 502, 503 while the database restarts, 504), or asks to wait (408, 429).
 * What was sent stays waiting and goes again later, as when there is no network.
 */
export function isTryLater(status: number): boolean {
	return status >= 500 || status === 408 || status === 429;
}

/**
 * Sends what is waiting for one job: items first (a photo may name one), then photos one by one.
 * Stops at the first network failure or "try later" answer (it stays waiting) or 401 (sign in to
 * send). Only the server's own answer takes an item off the list, never a send that failed.
 */
export async function flush(jobId: string, fetcher: typeof fetch = fetch): Promise<FlushResult> {
	const result: FlushResult = { sent: 0, signIn: false, offline: false };
	const waiting = (await itemsOf(jobId)).filter((i) => i.state === 'waiting');
	for (let i = 0; i < waiting.length; i += 100) {
		const batch = waiting.slice(i, i + 100);
		let response: Response;
		try {
			response = await fetcher(`/api/v1/field/jobs/${jobId}/items`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', accept: 'application/json' },
				body: JSON.stringify({ items: batch.map((b) => b.input) })
			});
		} catch {
			result.offline = true;
			return result;
		}
		if (response.status === 401) {
			result.signIn = true;
			return result;
		}
		if (isTryLater(response.status)) {
			result.offline = true;
			return result;
		}
		if (!response.ok) {
			const body = await response.json().catch(() => ({}));
			for (const b of batch) {
				await saveItem({ ...b, state: 'refused', message: body.message ?? 'Not taken' });
			}
			continue;
		}
		const body = (await response.json()) as {
			items: { clientId: string; status: string; item?: ServerItem; message?: string }[];
		};
		for (const answer of body.items) {
			const mine = batch.find((b) => b.clientId === answer.clientId);
			if (!mine) continue;
			if (answer.status === 'conflict') {
				await saveItem({
					...mine,
					state: 'conflict',
					server: answer.item,
					message: answer.message
				});
			} else if (answer.status === 'refused') {
				await saveItem({ ...mine, state: 'refused', message: answer.message });
			} else {
				result.sent += 1;
				await saveItem({ ...mine, state: 'sent', server: answer.item, message: undefined });
			}
		}
	}
	for (const photo of (await photosOf(jobId)).filter((p) => p.state === 'waiting')) {
		const form = new FormData();
		form.set('file', photo.blob, `${photo.clientId}.jpg`);
		form.set('clientId', photo.clientId);
		form.set('purpose', photo.purpose);
		form.set('roomId', photo.roomId ?? '');
		form.set('itemClientId', photo.itemClientId ?? '');
		form.set('caption', photo.caption);
		form.set('takenAt', photo.takenAt);
		let response: Response;
		try {
			response = await fetcher(`/api/v1/field/jobs/${jobId}/photos`, {
				method: 'POST',
				headers: { accept: 'application/json' },
				body: form
			});
		} catch {
			result.offline = true;
			return result;
		}
		if (response.status === 401) {
			result.signIn = true;
			return result;
		}
		if (isTryLater(response.status)) {
			result.offline = true;
			return result;
		}
		const body = await response.json().catch(() => ({}));
		if (response.ok) {
			result.sent += 1;
			await savePhoto({ ...photo, state: 'sent', serverId: body.id, message: undefined });
		} else if (response.status === 409 && photo.itemClientId) {
			// Its item is not on the server yet: try again next time.
			await savePhoto({ ...photo, message: body.message });
		} else {
			// Refused (not an image, too large): kept on the phone to retry or delete.
			await savePhoto({ ...photo, state: 'refused', message: body.message ?? 'Not taken' });
		}
	}
	return result;
}

/**
 * A photo made smaller on the phone before it is kept and sent: at most `longest` px on its
 * longest side, as JPEG. Browsers apply the EXIF orientation when decoding, so it stays upright.
 * A file the browser cannot decode is kept as it is (the server then says what is wrong).
 */
export async function shrinkPhoto(file: Blob, longest = 2000): Promise<Blob> {
	try {
		const bitmap = await createImageBitmap(file);
		const scale = Math.min(1, longest / Math.max(bitmap.width, bitmap.height));
		const canvas = document.createElement('canvas');
		canvas.width = Math.round(bitmap.width * scale);
		canvas.height = Math.round(bitmap.height * scale);
		canvas.getContext('2d')!.drawImage(bitmap, 0, 0, canvas.width, canvas.height);
		bitmap.close();
		const blob = await new Promise<Blob | null>((resolve) =>
			canvas.toBlob(resolve, 'image/jpeg', 0.85)
		);
		return blob ?? file;
	} catch {
		return file;
	}
}
