import { inStore, readInStore } from '$lib/server/db/tenant';
import * as priceBook from '$lib/server/db/queries/price-book';
import * as quotes from '$lib/server/db/queries/quotes';
import { previewQuote } from '$lib/server/quotes/build';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { estimate } from '$lib/estimating';
import { samplePriceBook } from '$lib/estimating/sample';
import { readFields } from '$lib/input';
import {
	floorForm,
	floorToForm,
	prepForm,
	removalForm,
	supplyForm,
	supplyToForm
} from '$lib/schemas/price-book';
import {
	applyTradeSettings,
	tradeSettingsFormSchema,
	tradeSettingsToForm
} from '$lib/schemas/store-settings';
import { fieldErrors } from '$lib/server/forms';
import { describe, expect, it } from 'vitest';
import { makeQuotedJob, makeStore } from './factories';

const floorFields = {
	name: 'Hickory plank 5 in',
	kind: 'hardwood',
	fastening: 'nailed',
	cartonSqFt: '22.5',
	boardWidth: '5 in',
	materialBasis: 'carton',
	materialPrice: '$129.90',
	materialCost: '78',
	labourPrice: '4.25',
	payPrice: '2.75',
	deflectionRatio: 'L/480',
	rhLimit: '',
	mverLimit: '',
	underlayment: 'no'
};

// Prices typed in US dollars unless a test says otherwise.
const floorFormSchema = floorForm('USD');
const prepFormSchema = prepForm('USD');
const removalFormSchema = removalForm('USD');
const supplyFormSchema = supplyForm('USD');

/** A settings form's dotted names as the action reads them. */
function nestForm(values: Record<string, string>) {
	const r = readFields(Object.entries(values));
	if (!r.ok) throw new Error(r.message);
	return r.value;
}

function errorsOf(result: { success: boolean; error?: unknown }) {
	expect(result.success).toBe(false);
	return fieldErrors(result.error as never);
}

describe('price-book forms', () => {
	it('turn a floor typed in dollars and text lengths into the engine’s product', () => {
		const r = floorFormSchema.safeParse(floorFields);
		expect(r.success).toBe(true);
		expect(r.data).toEqual({
			section: 'floor',
			code: '',
			name: 'Hickory plank 5 in',
			data: {
				kind: 'hardwood',
				fastening: 'nailed',
				cartonSqFt: 22.5,
				boardWidthIn: 5,
				material: { basis: 'carton', priceCents: 12_990, costCents: 7_800 },
				labourCentsPerSqFt: 425,
				payCentsPerSqFt: 275,
				needs: { deflectionRatio: 480, underlayment: false }
			}
		});
	});

	it('read roll widths and tile edges as typed, in any unit', () => {
		const carpet = floorFormSchema.safeParse({
			...floorFields,
			kind: 'carpet',
			rollWidth: "12'",
			cartonSqFt: '',
			materialBasis: 'roll_sqyd'
		});
		expect(carpet.data?.data).toMatchObject({ kind: 'carpet', rollWidthIn: 144 });
		expect(carpet.data?.data).not.toHaveProperty('cartonSqFt');
		const tile = floorFormSchema.safeParse({
			...floorFields,
			kind: 'ceramic_tile',
			tileEdges: '300 x 600 mm'
		});
		expect(tile.data?.data.tileEdgesIn?.map((e) => Math.round(e * 1000) / 1000)).toEqual([
			11.811, 23.622
		]);
		expect(tile.data?.data).not.toHaveProperty('boardWidthIn');
	});

	it('refuse an empty price by its field, and a length the engine cannot read', () => {
		const errors = errorsOf(
			floorFormSchema.safeParse({ ...floorFields, materialPrice: '', boardWidth: '5 1/0 in' })
		);
		expect(errors.materialPrice).toEqual(['Enter the material price, e.g. 12.50']);
		expect(errors.boardWidth?.[0]).toMatch(/fraction's bottom cannot be 0/);
		const prep = errorsOf(
			prepFormSchema.safeParse({ kind: 'level', basis: 'sqft', price: '', pay: '' })
		);
		expect(Object.keys(prep).sort()).toEqual(['pay', 'price']);
		const removal = errorsOf(
			removalFormSchema.safeParse({ existing: 'carpet', basis: 'sqft', price: '0.6', pay: '-1' })
		);
		expect(removal.pay).toEqual(['The installer pay cannot be negative']);
		const cents = errorsOf(
			prepFormSchema.safeParse({ kind: 'trim', basis: 'linft', price: '2.755', pay: '1' })
		);
		expect(cents.price?.[0]).toMatch(/two decimals/);
	});

	it('ask what each kind of floor needs: coverage for cartons, width and roll units for rolls', () => {
		const carton = errorsOf(floorFormSchema.safeParse({ ...floorFields, cartonSqFt: '' }));
		expect(carton.cartonSqFt?.[0]).toMatch(/one carton covers/);
		const roll = errorsOf(
			floorFormSchema.safeParse({ ...floorFields, kind: 'sheet_vinyl', materialBasis: 'carton' })
		);
		expect(Object.keys(roll).sort()).toEqual(['materialBasis', 'rollWidth']);
	});

	it('keep the product data of supplies: box count, container, bag yield', () => {
		const patch = supplyFormSchema.safeParse({
			kind: 'patch',
			name: 'Floor patch, 1 gal pail',
			basis: 'container',
			price: '36',
			patchBy: 'volume',
			patchVolume: '1 gal'
		});
		expect(patch.data?.data).toEqual({
			basis: 'container',
			priceCents: 3_600,
			container: { volumeCuIn: 231 }
		});
		expect(supplyToForm('patch', 'Floor patch', patch.data!.data, 'USD').patchVolume).toBe('1 gal');
		const leveller = errorsOf(
			supplyFormSchema.safeParse({ kind: 'leveller', name: 'SLU', basis: 'bag', price: '42' })
		);
		expect(leveller.bagYield?.[0]).toMatch(/data sheet/);
		const fasteners = errorsOf(
			supplyFormSchema.safeParse({ kind: 'fastener', name: 'Nails', basis: 'bag', price: '24' })
		);
		expect(fasteners.basis?.[0]).toMatch(/per box or each/);
	});

	it('keep what an install supply is counted by: coverage, yield, stock length (issue 12)', () => {
		const thinset = supplyFormSchema.safeParse({
			kind: 'thinset',
			name: 'Thinset, 50 lb bag',
			basis: 'bag',
			price: '38',
			coverage: '60'
		});
		expect(thinset.data?.data).toEqual({ basis: 'bag', priceCents: 3_800, coverageSqFt: 60 });
		const grout = supplyFormSchema.safeParse({
			kind: 'grout',
			name: 'Sanded grout, 25 lb',
			basis: 'bag',
			price: '26',
			bagYield: '0.2'
		});
		expect(grout.data?.data).toEqual({ basis: 'bag', priceCents: 2_600, bagYieldCuFt: 0.2 });
		const base = supplyFormSchema.safeParse({
			kind: 'baseboard',
			name: 'Baseboard, 16 ft',
			basis: 'each',
			price: '24',
			stockLength: '16 ft'
		});
		expect(base.data?.data).toEqual({ basis: 'each', priceCents: 2_400, stockLengthIn: 192 });
		expect(supplyToForm('baseboard', 'Baseboard, 16 ft', base.data!.data, 'USD').stockLength).toBe(
			'16\' 0"'
		);
		// each refused without its data-sheet figure, by its field; the engine's bounds hold
		expect(
			errorsOf(
				supplyFormSchema.safeParse({ kind: 'backer', name: 'B', basis: 'panel', price: '16' })
			).coverage?.[0]
		).toMatch(/3 × 5 ft sheet/);
		expect(
			errorsOf(supplyFormSchema.safeParse({ kind: 'grout', name: 'G', basis: 'bag', price: '26' }))
				.bagYield?.[0]
		).toMatch(/data sheet/);
		expect(
			errorsOf(
				supplyFormSchema.safeParse({
					kind: 'shoe',
					name: 'S',
					basis: 'each',
					price: '11',
					stockLength: '80 ft'
				})
			).stockLength?.[0]
		).toMatch(/at most 480 in/);
		// a tile's grout joint and depth are read as lengths, for tile only
		const tile = floorFormSchema.safeParse({
			...floorFields,
			kind: 'ceramic_tile',
			fastening: '',
			tileEdges: '12 x 24',
			groutJoint: '1/8',
			groutDepth: '3/8 in'
		});
		expect(tile.data?.data).toMatchObject({ groutJointIn: 0.125, groutDepthIn: 0.375 });
		const wood = floorFormSchema.safeParse({ ...floorFields, groutJoint: '1/8' });
		expect(wood.data?.data).not.toHaveProperty('groutJointIn');
	});

	it('read one number rule: 1,500 is fifteen hundred, 0,5 is refused (it was 5 here, 0.5 in the calculators)', () => {
		const grouped = floorFormSchema.safeParse({ ...floorFields, materialPrice: '1,250.00' });
		expect(grouped.data?.data.material.priceCents).toBe(125_000);
		const comma = errorsOf(floorFormSchema.safeParse({ ...floorFields, cartonSqFt: '0,5' }));
		expect(comma.cartonSqFt?.[0]).toMatch(/use a point for decimals/);
		const price = errorsOf(
			prepFormSchema.safeParse({ kind: 'level', basis: 'sqft', price: '2,5', pay: '1' })
		);
		expect(price.price?.[0]).toMatch(/use a point for decimals/);
		const count = errorsOf(
			supplyFormSchema.safeParse({
				kind: 'fastener',
				name: 'Nails',
				basis: 'box',
				price: '24',
				perBox: '1e3'
			})
		);
		expect(count.perBox?.[0]).toMatch(/Cannot read "1e3"/);
	});

	it('take prices in a zero-decimal currency as whole units (JPY, Stripe, published)', () => {
		const yen = prepForm('JPY').safeParse({
			kind: 'level',
			basis: 'sqft',
			price: '¥1,200',
			pay: '800'
		});
		expect(yen.data?.data).toMatchObject({ priceCents: 1200, payCents: 800 });
		const decimals = errorsOf(
			prepForm('JPY').safeParse({ kind: 'level', basis: 'sqft', price: '12.50', pay: '8' })
		);
		expect(decimals.price).toEqual(['JPY has no decimals: type a whole amount, e.g. 1250']);
		expect(
			errorsOf(prepForm('JPY').safeParse({ kind: 'level', basis: 'sqft', price: '', pay: '8' }))
				.price
		).toEqual(['Enter the customer price, e.g. 1250']);
		const shown = floorToForm('Oak', { ...floorFormSchema.parse(floorFields).data }, 'JPY');
		expect(shown.materialPrice).toBe('12990');
		expect(floorForm('JPY').parse(shown).data.material.priceCents).toBe(12_990);
	});

	it('show a saved floor back as it was typed', () => {
		const r = floorFormSchema.safeParse(floorFields);
		const again = floorFormSchema.safeParse(floorToForm(r.data!.name, r.data!.data, 'USD'));
		expect(again.data).toEqual(r.data);
	});
});

describe('trade settings form', () => {
	it('lays taxes, deposit, waste, schedule and crew output over the whole settings document', async () => {
		const store = await makeStore('Settings Floors');
		const current = await inStore(store.id, (tx) => tradeSettings.read(tx));
		const values = {
			...tradeSettingsToForm(current.settings, current.quoteValidDays, current.currency),
			'taxes.0.name': 'County tax',
			'taxes.0.rate': '6.5',
			'taxes.0.labour': 'on',
			'taxes.1.name': '',
			'taxes.1.rate': '',
			'deposit.percent': '25',
			'deposit.minimum': '150',
			'waste.herringbone': '22.5',
			fasteningSchedule: 'staples',
			'crew.carpet': '900'
		};
		const form = tradeSettingsFormSchema(
			Object.keys(current.settings.underlayment.schedules),
			current.currency
		).safeParse(nestForm(values));
		expect(form.success).toBe(true);
		const applied = applyTradeSettings(current.settings, form.data!);
		if (!applied.ok) throw new Error(JSON.stringify(applied.errors));
		expect(applied.settings.taxes).toEqual([
			{ name: 'County tax', rateBps: 650, groups: ['material', 'labour'] }
		]);
		expect(applied.settings.deposit).toEqual({ percentBps: 2500, minimumCents: 15_000 });
		expect(applied.settings.wastePct.herringbone).toBe(22.5);
		expect(applied.settings.underlayment.schedule).toBe('staples');
		expect(applied.settings.schedule.crewSqFtPerDay.carpet).toBe(900);
		// Every other default is kept.
		expect(applied.settings.joists).toEqual(current.settings.joists);
		expect(applied.settings.moisture).toEqual(current.settings.moisture);
	});

	it('keeps acclimation in days by floor, and the setting-materials waste and trim allowance (issue 12)', async () => {
		const store = await makeStore('Acclimation Floors');
		const current = await inStore(store.id, (tx) => tradeSettings.read(tx));
		const schema = tradeSettingsFormSchema(
			Object.keys(current.settings.underlayment.schedules),
			current.currency
		);
		const shown = tradeSettingsToForm(current.settings, current.quoteValidDays, current.currency);
		// the saved 72 h for solid wood shows as 3 days; a floor with none as 0
		expect(shown['acclimation.hardwood']).toBe('3');
		expect(shown['acclimation.carpet']).toBe('0');
		expect(shown.setWaste).toBe('10');
		const form = schema.safeParse(
			nestForm({
				...shown,
				'acclimation.hardwood': '5',
				'acclimation.engineered_wood': '5',
				'acclimation.vinyl_plank': '0',
				'acclimation.ceramic_tile': '0.5',
				setWaste: '15',
				trimAllowance: '3 in'
			})
		);
		expect(form.success).toBe(true);
		const applied = applyTradeSettings(current.settings, form.data!);
		if (!applied.ok) throw new Error(JSON.stringify(applied.errors));
		expect(applied.settings.schedule.acclimationHours).toMatchObject({
			hardwood: 120,
			ceramic_tile: 12
		});
		expect(applied.settings.schedule.acclimationHours).not.toHaveProperty('vinyl_plank');
		expect(applied.settings.installSupplies).toEqual({ wastePct: 15, trimEndAllowanceIn: 3 });
		// the schedule holds an engineered-wood install for the 5 days (maker instructions)
		const r = estimate({
			job: {
				rooms: [
					{
						id: 'd',
						name: 'Den',
						shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
						floor: { productId: 'oak-7', layout: 'straight' },
						subfloor: { kind: 'plywood', thicknessIn: 0.75 }
					}
				]
			},
			settings: applied.settings,
			priceBook: samplePriceBook
		});
		expect(r.schedule.steps.find((st) => st.key === 'install')?.notBeforeHours).toBe(120);
		// beyond 12 weeks, and a negative day, are refused by their fields
		const bad = schema.safeParse(
			nestForm({ ...shown, 'acclimation.hardwood': '90', 'acclimation.laminate': '-1' })
		);
		const errors = errorsOf(bad);
		expect(errors['acclimation.hardwood']?.[0]).toMatch(/84/);
		expect(errors['acclimation.laminate']?.[0]).toBeDefined();
	});

	it('refuses an empty rate and a deposit over 100 % by their fields', () => {
		const form = tradeSettingsFormSchema(['apa_quarter_in'], 'USD').safeParse(
			nestForm({
				'taxes.0.name': 'Sales tax',
				'taxes.0.rate': '',
				taxRounding: 'half_up',
				'deposit.percent': '120',
				'deposit.minimum': '',
				quoteValidDays: '30',
				'units.system': 'imperial',
				'units.defaultLengthUnit': 'in',
				fasteningSchedule: 'nope'
			})
		);
		const errors = errorsOf(form);
		expect(errors['taxes.0.rate']).toEqual(['Enter the rate, e.g. 6.5']);
		expect(errors['deposit.percent']).toEqual(['A percentage is at most 100']);
		expect(errors['deposit.minimum']?.[0]).toMatch(/minimum deposit/);
		expect(errors.fasteningSchedule).toBeDefined();
		expect(errors['waste.straight']).toBeDefined();
		expect(errors['crew.laminate']).toBeDefined();
	});
});

describe('trade settings form in a zero-decimal currency', () => {
	it('reads the minimum deposit in whole yen and shows it back so (Stripe zero-decimal, published)', async () => {
		const store = await makeStore('Yen Floors');
		const current = await readInStore(store.id, (tx) => tradeSettings.read(tx));
		const schedules = Object.keys(current.settings.underlayment.schedules);
		const values = {
			...tradeSettingsToForm(current.settings, current.quoteValidDays, 'JPY'),
			'deposit.minimum': '¥25,000'
		};
		const form = tradeSettingsFormSchema(schedules, 'JPY').safeParse(nestForm(values));
		expect(form.success).toBe(true);
		expect(form.data!.deposit.minimum).toBe(25_000);
		const applied = applyTradeSettings(current.settings, form.data!);
		if (!applied.ok) throw new Error(JSON.stringify(applied.errors));
		expect(tradeSettingsToForm(applied.settings, 30, 'JPY')['deposit.minimum']).toBe('25000');
		const cents = errorsOf(
			tradeSettingsFormSchema(schedules, 'JPY').safeParse(
				nestForm({ ...values, 'deposit.minimum': '250.50' })
			)
		);
		expect(cents['deposit.minimum']).toEqual([
			'JPY has no decimals: type a whole amount, e.g. 1250'
		]);
	});
});

describe('price-book lines', () => {
	it('are checked with the engine’s schema on create and update, and nothing is written when refused', async () => {
		const store = await makeStore('Checked Floors');
		await expect(
			inStore(store.id, (tx) =>
				priceBook.create(tx, {
					section: 'prep',
					code: 'level',
					name: 'Level',
					data: { basis: 'sqft', priceCents: 12.5, payCents: 50 }
				})
			)
		).rejects.toBeInstanceOf(priceBook.InvalidPriceItem);
		await expect(
			inStore(store.id, (tx) =>
				priceBook.create(tx, {
					section: 'prep',
					code: 'not_a_prep',
					name: 'x',
					data: { basis: 'sqft', priceCents: 100, payCents: 50 }
				})
			)
		).rejects.toThrow(/code|kind|Invalid/);
		expect(await inStore(store.id, (tx) => priceBook.list(tx))).toEqual([]);

		const line = await inStore(store.id, (tx) =>
			priceBook.create(tx, {
				section: 'removal',
				code: 'carpet',
				name: 'Tear out carpet',
				data: { basis: 'sqft', priceCents: 60, payCents: 40 }
			})
		);
		await expect(
			inStore(store.id, (tx) =>
				priceBook.update(tx, line.id, { data: { basis: 'yard', priceCents: 60, payCents: 40 } })
			)
		).rejects.toBeInstanceOf(priceBook.InvalidPriceItem);
		await expect(
			inStore(store.id, (tx) =>
				priceBook.create(tx, {
					section: 'removal',
					code: 'carpet',
					name: 'Again',
					data: { basis: 'sqft', priceCents: 1, payCents: 1 }
				})
			)
		).rejects.toBeInstanceOf(priceBook.DuplicatePriceItem);
		const updated = await inStore(store.id, (tx) =>
			priceBook.update(tx, line.id, {
				data: { basis: 'room', priceCents: 9_000, payCents: 6_000 }
			})
		);
		expect(updated?.data).toEqual({ basis: 'room', priceCents: 9_000, payCents: 6_000 });
		expect((await inStore(store.id, (tx) => priceBook.list(tx))).length).toBe(1);
	});

	it('a price change leaves a built quote’s stored input and result as they were', async () => {
		const store = await makeStore('Frozen Floors');
		const { quote, floors, job } = await makeQuotedJob(store);
		const lvp = (await inStore(store.id, (tx) => priceBook.read(tx, floors['lvp-grey'])))!;
		const before = quote.input.priceBook.floors.find((f) => f.id === lvp.id)!;
		expect(before.material.priceCents).toBe(329);

		const parsed = floorFormSchema.safeParse({
			...floorToForm(lvp.name, lvp.data as never, 'USD'),
			materialPrice: '4.99'
		});
		await inStore(store.id, (tx) => priceBook.update(tx, lvp.id, { data: parsed.data!.data }));
		expect(
			(
				(await inStore(store.id, (tx) => priceBook.read(tx, lvp.id)))!.data as {
					material: { priceCents: number };
				}
			).material.priceCents
		).toBe(499);

		const stored = (await inStore(store.id, (tx) => quotes.read(tx, quote.id)))!;
		expect(stored.input).toEqual(quote.input);
		expect(stored.totalCents).toBe(quote.totalCents);
		expect(estimate(stored.input).totals).toEqual(quote.result.totals);
		// Today's preview uses the new price.
		const preview = await inStore(store.id, (tx) => previewQuote(tx, job.id));
		expect(preview!.result.totals.subtotalCents).toBeGreaterThan(quote.subtotalCents);
	});

	it('of another store cannot be read, changed or deleted', async () => {
		const a = await makeStore('A Floors');
		const b = await makeStore('B Floors');
		const theirs = await inStore(b.id, (tx) =>
			priceBook.create(tx, {
				section: 'removal',
				code: 'laminate',
				name: 'Tear out laminate',
				data: { basis: 'sqft', priceCents: 75, payCents: 50 }
			})
		);
		expect(await inStore(a.id, (tx) => priceBook.read(tx, theirs.id))).toBeUndefined();
		expect(
			await inStore(a.id, (tx) =>
				priceBook.update(tx, theirs.id, {
					data: { basis: 'sqft', priceCents: 1, payCents: 1 }
				})
			)
		).toBeUndefined();
		expect(await inStore(a.id, (tx) => priceBook.remove(tx, theirs.id))).toBe(false);
		expect(await inStore(a.id, (tx) => priceBook.list(tx))).toEqual([]);
		expect((await inStore(b.id, (tx) => priceBook.read(tx, theirs.id)))?.data).toEqual({
			basis: 'sqft',
			priceCents: 75,
			payCents: 50
		});
	});
});
