import { describe, expect, it } from 'vitest';
import { estimate, forCustomer, forInstaller } from './estimate';
import type { EstimateInput, RoomMeasure } from './index';
import { samplePriceBook, sampleJob } from './sample';
import { defaultSettings } from './settings';

const input = (rooms: RoomMeasure[], builtYear?: number): EstimateInput => ({
	job: { rooms, builtYear },
	settings: defaultSettings,
	priceBook: samplePriceBook
});

const bedroom: RoomMeasure = {
	id: 'bed',
	name: 'Bedroom',
	shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 }
};

describe('estimate', () => {
	it('prices a whole sample job deterministically, from stored (JSON) inputs too', () => {
		const a = estimate(input(sampleJob(12).rooms, 1975));
		expect(a.ok).toBe(true);
		expect(a.errors).toEqual([]);
		const stored = JSON.parse(JSON.stringify(input(sampleJob(12).rooms, 1975)));
		expect(estimate(stored)).toEqual(a);
		const sum = a.lines.reduce((t, l) => t + l.amountCents, 0);
		expect(a.totals.subtotalCents).toBe(sum);
		expect(a.installerPayCents).toBe(a.pay.reduce((t, p) => t + p.amountCents, 0));
		expect(a.margin.marginCents).toBe(
			a.totals.subtotalCents - a.installerPayCents - a.margin.costCents
		);
		expect(a.schedule.days).toBeGreaterThan(0);
		expect(new Set(a.lines.map((l) => l.id)).size).toBe(a.lines.length);
	});

	// Issue 11, rough edges: sheet goods were offered herringbone and diagonal layouts. Roll
	// goods are laid in drops along the room (common practice), so only straight is allowed.
	it('refuses a diagonal or herringbone layout for roll goods, at the layout field', () => {
		for (const productId of ['sheet-6', 'carpet-12'])
			for (const layout of ['diagonal', 'herringbone'] as const) {
				const r = estimate(input([{ ...bedroom, floor: { productId, layout } }]));
				expect(r.ok).toBe(false);
				expect(r.errors).toEqual([
					expect.objectContaining({ path: 'job.rooms.0.floor.layout', roomId: 'bed' })
				]);
			}
		const straight = estimate(
			input([{ ...bedroom, floor: { productId: 'sheet-6', layout: 'straight' } }])
		);
		expect(straight.errors).toEqual([]);
	});

	it('takes off a plank room: cartons, install, underlayment and fasteners', () => {
		// 120 ft² × 1.10 ÷ 23.64 = 5.58 → 6 cartons, priced per ft² of whole cartons: 141.84 ft²
		const r = estimate(input([bedroom]));
		expect(r.rooms[0].floor?.cartons?.cartons).toBe(6);
		const floor = r.lines.find((l) => l.key === 'floor:lvp-grey');
		expect(floor).toMatchObject({ basis: 'sqft', qty: 141.84, amountCents: 46_665 });
		// vinyl plank over wood gets new underlayment (store setting): 120 × 1.1 ÷ 32 = 4.1 → 5 panels
		expect(r.lines.find((l) => l.key === 'supply:underlayment_panel')?.qty).toBe(5);
		// 5 × 201 = 1005 fasteners → 2 boxes of 1000
		expect(r.lines.find((l) => l.key === 'supply:fastener')?.qty).toBe(2);
		expect(r.lines.find((l) => l.key === 'install:lvp-grey')?.amountCents).toBe(24_000);
	});

	it('ties failed checks to the prep lines they caused, with cautions', () => {
		const tile: RoomMeasure = {
			...bedroom,
			id: 'bath',
			name: 'Bath',
			floor: { productId: 'tile-12', layout: 'straight' },
			joists: { size: '2x8', species: 'hem_fir', spacingIn: 16, spanIn: 180 },
			readings: { flatness: [{ spanIn: 120, gapIn: 0.25, areaSqFt: 10 }] }
		};
		const r = estimate(input([tile]));
		const deflection = r.findings.find((f) => f.check === 'joist_deflection');
		expect(deflection?.pass).toBe(false);
		expect(deflection?.lineIds).toEqual(['bath:prep:joist_sister']);
		expect(deflection?.cautionTexts.join(' ')).toContain('licensed professional');
		const sister = r.lines.find((l) => l.key === 'prep:joist_sister');
		// joists across the 12 ft side at 16 in o.c.: ⌊144 ÷ 16⌋ + 1 = 10
		expect(sister?.qty).toBe(10);
		// 12 × 24 in tile is large-format: 1/4 in in 10 ft fails the 1/8 in rule
		const flat = r.findings.find((f) => f.check === 'flatness');
		expect(flat).toMatchObject({ pass: false, limit: 0.125 });
		// level 10 ft² at an average depth of 1/8 in (half the gap): 10 × 1 = 10 ft²-per-1/8-in
		expect(r.lines.find((l) => l.key === 'prep:level')).toMatchObject({
			qty: 10,
			amountCents: 950
		});
		expect(r.cautions.map((c) => c.kind)).toContain('structure');
	});

	it('shows the asbestos caution where tear-out of older resilient floors is priced', () => {
		const old = estimate(input([{ ...bedroom, remove: ['sheet_vinyl'] }], 1972));
		const note = old.cautions.find((c) => c.kind === 'asbestos');
		expect(note?.lineIds).toEqual(['bed:removal:sheet_vinyl']);
		expect(
			estimate(input([{ ...bedroom, remove: ['sheet_vinyl'] }])).cautions.some(
				(c) => c.kind === 'asbestos'
			)
		).toBe(true);
		expect(
			estimate(input([{ ...bedroom, remove: ['sheet_vinyl'] }], 2005)).cautions.some(
				(c) => c.kind === 'asbestos'
			)
		).toBe(false);
		expect(
			estimate(input([{ ...bedroom, remove: ['carpet'] }], 1972)).cautions.some(
				(c) => c.kind === 'asbestos'
			)
		).toBe(false);
	});

	it('ignores a hole under 1 in under new underlayment, repairs bigger ones', () => {
		const r = estimate(
			input([
				{
					...bedroom,
					repairs: {
						holes: [
							{ widthIn: 0.5, lengthIn: 0.5 },
							{ widthIn: 6, lengthIn: 6 }
						]
					}
				}
			])
		);
		expect(r.rooms[0].holes.map((h) => h.ignored)).toEqual([true, false]);
		expect(r.lines.find((l) => l.key === 'prep:hole_repair')?.qty).toBe(1);
	});

	it('returns error entries naming the room and field, and still prices the rest', () => {
		const r = estimate(
			input([
				{ ...bedroom, id: 'a', name: 'Hall', shape: { kind: 'rect', widthIn: 0, lengthIn: 100 } },
				{ ...bedroom, id: 'b', name: 'Den', floor: undefined },
				{
					...bedroom,
					id: 'c',
					name: 'Office',
					repairs: { seams: [{ lengthIn: 48, widthIn: 0.25, depthIn: 0.25 }] }
				},
				{ ...bedroom, id: 'd', name: 'Study', floor: { productId: 'missing', layout: 'straight' } },
				bedroom
			])
		);
		expect(r.ok).toBe(false);
		expect(r.errors).toEqual([
			{
				path: 'job.rooms.0.shape',
				roomId: 'a',
				message: 'Hall: A rectangle needs a width and a length above zero'
			},
			{ path: 'job.rooms.1.floor', roomId: 'b', message: 'Den: choose a floor' },
			{
				path: 'job.rooms.3.floor.productId',
				roomId: 'd',
				message: 'Study: floor "missing" is not in the price book'
			}
		]);
		const noSeamPrice = estimate({
			...input([
				{
					...bedroom,
					underlayment: false,
					repairs: { seams: [{ lengthIn: 48, widthIn: 0.25, depthIn: 0.25 }] }
				}
			]),
			priceBook: {
				...samplePriceBook,
				prep: samplePriceBook.prep.filter((p) => p.kind !== 'seam_patch')
			}
		});
		expect(noSeamPrice.errors).toEqual([
			{
				path: 'priceBook.prep',
				roomId: 'bed',
				message: 'No price for prep "seam_patch" (needed in Bedroom)'
			}
		]);
		expect(r.lines.some((l) => l.roomId === 'bed')).toBe(true);
	});

	it('warns where a check could not run', () => {
		const r = estimate(
			input([
				{ ...bedroom, floor: { productId: 'tile-12', layout: 'straight' } },
				{ ...bedroom, id: 'bsmt', name: 'Basement', subfloor: { kind: 'concrete' } }
			])
		);
		expect(r.warnings.map((w) => w.roomId)).toEqual(['bed', 'bsmt']);
	});

	it('shows the customer prices and the installer pay, never the other', () => {
		const r = estimate(input(sampleJob(6).rooms));
		const customer = JSON.stringify(forCustomer(r));
		expect(customer).not.toContain('payCents');
		expect(customer).not.toContain('margin');
		expect(customer).toContain('amountCents');
		const installer = forInstaller(r);
		const text = JSON.stringify(installer);
		expect(text).not.toContain(
			'unitCents":' + r.lines[0].unitCents + ',"amountCents":' + r.lines[0].amountCents
		);
		expect(text).not.toContain('margin');
		expect(text).not.toContain('totalCents');
		expect(installer.installerPayCents).toBe(r.installerPayCents);
		expect(installer.work[0]).not.toHaveProperty('amountCents');
	});
});
