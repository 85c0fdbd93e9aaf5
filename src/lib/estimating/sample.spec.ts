import { describe, expect, it } from 'vitest';
import { estimate } from './estimate';
import { samplePriceBook, sampleJob } from './sample';
import { defaultSettings } from './settings';

describe('sample data', () => {
	it('builds jobs of any size that estimate without errors and exercise every floor', () => {
		const job = sampleJob(60);
		expect(job.rooms).toHaveLength(60);
		expect(new Set(job.rooms.map((r) => r.shape.kind))).toEqual(
			new Set(['rect', 'rects', 'sides', 'points'])
		);
		const r = estimate({ job, settings: defaultSettings, priceBook: samplePriceBook });
		expect(r.errors).toEqual([]);
		const floors = new Set(r.lines.filter((l) => l.ref.type === 'floor').map((l) => l.key));
		expect(floors.size).toBe(samplePriceBook.floors.length);
	});
});
