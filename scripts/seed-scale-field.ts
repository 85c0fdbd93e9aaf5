// The installer's half of the scale seed's template store: on each job under way, the field
// report (checked in), a reading, a note and prep found beyond what was sold, two photos (small
// images generated with sharp, written in the local file store's layout,
// `<store>/photos/<job>/<id>.jpg`), and the report sent, which prices a change order through the
// app's own `changeOrderFromReport`. Rows through the app's query modules: the workflows in
// $lib/server/field import SvelteKit's `$env`, which a script run by tsx cannot load.
// scripts/seed-scale.ts then copies these rows to every store (the copies share the files).
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { and, eq } from 'drizzle-orm';
import { changeOrderFromReport } from '../src/lib/server/change-orders/from-report';
import * as field from '../src/lib/server/db/queries/field';
import { reportChoices } from '../src/lib/server/field/work-order';
import { job } from '../src/lib/server/db/schema';
import { inStore } from '../src/lib/server/db/tenant';

/** A small picture of a floor: plank stripes in a few colours, `n` picks them. */
async function floorPicture(n: number, width: number, height: number): Promise<Buffer> {
	const colours = ['#b08457', '#8d6e4f', '#c9a77c', '#6f5843'];
	const plank = height / 8;
	const stripes = Array.from(
		{ length: 8 },
		(_, i) =>
			`<rect x="0" y="${i * plank}" width="${width}" height="${plank - 4}" fill="${colours[(i + n) % colours.length]}"/>`
	).join('');
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">${stripes}</svg>`;
	return sharp(Buffer.from(svg)).jpeg({ quality: 70 }).toBuffer();
}

export async function addFieldWork(storeId: string, dataDir: string) {
	const working = await inStore(storeId, (tx) =>
		tx
			.select({ id: job.id, installerId: job.installerId })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.status, 'in_progress')))
	);
	let n = 0;
	for (const w of working) {
		const installer = w.installerId;
		if (!installer) continue;
		const photos: { fileKey: string; thumbKey: string; bytes: number }[] = [];
		for (let p = 0; p < 2; p++) {
			const name = crypto.randomUUID();
			const fileKey = `${storeId}/photos/${w.id}/${name}.jpg`;
			const thumbKey = `${storeId}/photos/${w.id}/${name}-thumb.jpg`;
			const image = await floorPicture(n, 640, 480);
			const thumb = await floorPicture(n++, 160, 120);
			await mkdir(path.join(dataDir, path.dirname(fileKey)), { recursive: true });
			await writeFile(path.join(dataDir, fileKey), image);
			await writeFile(path.join(dataDir, thumbKey), thumb);
			photos.push({ fileKey, thumbKey, bytes: image.length });
		}
		await inStore(storeId, async (tx) => {
			const report = await field.createReport(tx, w.id, installer);
			if (!report) throw new Error('Scale seed: no field report');
			await field.addEvent(tx, w.id, 'check_in', installer, 'Checked in');
			const now = new Date();
			await field.insertItem(tx, {
				reportId: report.id,
				clientId: `scale-rh-${w.id}`,
				kind: 'reading',
				readingKind: 'rh',
				reading: { pct: 72 },
				note: '',
				recordedBy: installer,
				recordedAt: now
			});
			await field.insertItem(tx, {
				reportId: report.id,
				clientId: `scale-note-${w.id}`,
				kind: 'note',
				note: 'Subfloor swept; two soft spots by the door marked.',
				recordedBy: installer,
				recordedAt: now
			});
			// Prep the measure missed: four more of the quote's first prep item than were sold.
			const choices = await reportChoices(tx, w.id);
			const found = [...choices.items.values()].find((c) => c.ref.type === 'prep');
			if (found) {
				const room = choices.rooms[0]?.id ?? null;
				await field.insertItem(tx, {
					reportId: report.id,
					clientId: `scale-found-${w.id}`,
					kind: 'found',
					roomId: room,
					ref: found.ref,
					refKey: found.refKey,
					qty: (choices.sold.get(`${room ?? ''}|${found.refKey}`) ?? 0) + 4,
					unit: found.unit,
					note: 'More than the measure showed',
					recordedBy: installer,
					recordedAt: now
				});
			}
			for (const [p, f] of photos.entries()) {
				await field.insertPhoto(tx, {
					jobId: w.id,
					clientId: `scale-photo-${p}-${w.id}`,
					purpose: 'report',
					fileKey: f.fileKey,
					thumbKey: f.thumbKey,
					mediaType: 'image/jpeg',
					byteSize: f.bytes,
					width: 640,
					height: 480,
					caption: p === 0 ? 'Subfloor before prep' : 'Soft spot by the door',
					takenAt: now,
					uploadedBy: installer
				});
			}
			await field.markSubmitted(tx, report.id, installer);
			const change = await changeOrderFromReport(tx, report.id, installer);
			if (!change.ok) throw new Error(`Scale seed: no change order (${change.reason})`);
		});
	}
}
