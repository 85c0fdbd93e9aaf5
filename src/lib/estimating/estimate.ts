/**
 * The whole job as a pipeline of named pure steps, room by room: the room's shape, then
 * takeoff (floor, tear-out), repairs, checks, the cover over the subfloor (underlayment, trim,
 * transitions) and pricing; then the job's materials rounded up once, the schedule and the
 * cautions. Bad input becomes an error entry naming the room and field; the other rooms still
 * price.
 */
import { CAUTION_KINDS, CAUTIONS, type CautionKind } from './cautions';
import { cornersOf, roomOutline, roomShape, type RoomShape } from './geometry';
import { countWithin, LIMITS, LimitError, placed } from './limits';
import { OPTIONAL_PREP, PREP, type PrepKind } from './prep';
import {
	margin,
	PriceIndex,
	priceQty,
	totals,
	type FloorProduct,
	type PayLine,
	type PriceLine
} from './pricing';
import { checksStep } from './steps/checks';
import { materialItems, prepItems, priceItems, type JobOrder, type Priced } from './steps/pricing';
import { repairsStep } from './steps/repairs';
import {
	mergeNeeds,
	roomContext,
	type CautionEvent,
	type HoursEntry,
	type NeedEvent,
	type RoomContext,
	type WorkItem
} from './steps/room';
import { hoursByKey, scheduleStep } from './steps/schedule';
import { installSupplies } from './steps/supplies';
import { coverTakeoff, extrasTakeoff, floorTakeoff, supplyTakeoff } from './steps/takeoff';
import { prepHours } from './steps/schedule';
import { buildUpIn, doorChecks } from './doorways';
import { layoutsFor } from './settings';
import { slabTestChecks } from './substrate';
import { formatLength } from './units';
import { cautionTexts } from './cautions';
import type {
	CautionNote,
	EstimateError,
	EstimateInput,
	EstimateResult,
	Finding,
	RoomMeasure,
	RoomResult
} from './types';

/**
 * Appends without spreading a list of any length into a call. Indexed, not `for…of`: called
 * with lists of every kind, the iterator did not always get optimised away.
 */
function append<T>(to: T[], items: readonly T[]): void {
	for (let i = 0; i < items.length; i++) to.push(items[i]);
}

/** What one room brings to the job. */
interface RoomOutcome {
	result: RoomResult;
	errors: EstimateError[];
	findings: Finding[];
	priced?: Priced;
	hours: HoursEntry[];
	cautions: CautionEvent[];
	slabReadings?: { rh: number; cc: number; needsTests: boolean };
	order?: {
		productId: string;
		cartonSqFt?: number;
		rollCutIn?: number;
		panelSqFt: number;
		voids: JobOrder['voids'];
		levelAreas: JobOrder['levelAreas'];
	};
}

function emptyRoom(room: RoomMeasure): RoomResult {
	return {
		id: room.id,
		name: room.name,
		ok: false,
		areaSqFt: 0,
		perimeterIn: 0,
		wallPerimeterIn: 0,
		holes: [],
		prep: [],
		findingIds: [],
		warnings: []
	};
}

/**
 * Refuses a job beyond the engine's `LIMITS` before any room is worked out: too many rooms,
 * corners, price-book lines or settings rows. Each room's own lists are checked by its steps.
 */
function checkJob(input: EstimateInput): void {
	const { job, settings: s } = input;
	countWithin(job.rooms.length, 'job.rooms', 'rooms', LIMITS.rooms);
	let corners = 0;
	for (const room of job.rooms) {
		corners += cornersOf(room.shape);
		for (const c of room.cutouts ?? []) corners += cornersOf(c.shape);
	}
	countWithin(corners, 'job.rooms', 'corners in the job', LIMITS.jobCorners);
	const rows: [string, readonly unknown[]][] = [
		['settings.taxes', s.taxes],
		['settings.underlayment.requiredFor', s.underlayment.requiredFor],
		['settings.sheathing.boardMinIn', s.sheathing.boardMinIn],
		...Object.entries(s.sheathing.floorMinIn).map(([k, v]): [string, readonly unknown[]] => [
			`settings.sheathing.floorMinIn.${k}`,
			v ?? []
		]),
		...Object.entries(s.flatness.rules).map(([k, v]): [string, readonly unknown[]] => [
			`settings.flatness.rules.${k}`,
			v
		]),
		...input.priceBook.floors.map((f, i): [string, readonly unknown[]] => [
			`priceBook.floors.${i}.needs.flatness`,
			f.needs?.flatness ?? []
		])
	];
	for (const [path, list] of rows) countWithin(list.length, path, 'rows', LIMITS.settingsRows);
}

/** A refused estimate: the errors, and nothing priced. */
function refused(errors: EstimateError[]): EstimateResult {
	const nothing = { material: 0, labour: 0, prep: 0, removal: 0 };
	return {
		ok: false,
		errors,
		rooms: [],
		findings: [],
		lines: [],
		pay: [],
		totals: {
			byGroup: nothing,
			subtotalCents: 0,
			taxes: [],
			taxCents: 0,
			totalCents: 0,
			depositCents: 0,
			balanceCents: 0
		},
		installerPayCents: 0,
		margin: margin(0, 0, 0, true),
		schedule: { steps: [], workHours: 0, cureHours: 0, days: 0 },
		cautions: cautionNotes([{ kind: 'planning_aid' }]),
		warnings: []
	};
}

/** An error entry for a refusal, marked with the limit it passed. */
function limitError(e: LimitError, roomId?: string): EstimateError {
	const error: EstimateError = { path: e.path, message: e.message, limit: e.limit };
	if (roomId !== undefined) error.roomId = roomId;
	return error;
}

/** The room's shape and floor, or the error that stops it before any step runs. */
function readyRoom(
	room: RoomMeasure,
	i: number,
	input: EstimateInput,
	index: PriceIndex,
	result: RoomResult
): { shape: RoomShape; product: FloorProduct } | EstimateError {
	const path = `job.rooms.${i}`;
	const label = room.name || `Room ${i + 1}`;
	const shape = placed(
		() =>
			roomShape(room.shape, room.cutouts, {
				closureToleranceIn: input.settings.geometry.closureToleranceIn
			}),
		(field) =>
			field === 'closureToleranceIn' ? 'settings.geometry.closureToleranceIn' : `${path}.${field}`
	);
	if (!shape.ok)
		return {
			path: `${path}.${shape.field}`,
			roomId: room.id,
			message: `${label}: ${shape.message}`
		};
	result.areaSqFt = shape.areaSqFt;
	result.perimeterIn = shape.perimeterIn;
	result.wallPerimeterIn = shape.wallPerimeterIn;
	result.outline = roomOutline(shape);
	append(result.warnings, shape.warnings);
	if (!room.floor)
		return { path: `${path}.floor`, roomId: room.id, message: `${label}: choose a floor` };
	const product = index.floors.get(room.floor.productId);
	if (!product)
		return {
			path: `${path}.floor.productId`,
			roomId: room.id,
			message: `${label}: floor "${room.floor.productId}" is not in the price book`
		};
	if (!layoutsFor(product.kind).includes(room.floor.layout))
		return {
			path: `${path}.floor.layout`,
			roomId: room.id,
			message: `${label}: ${product.kind === 'carpet' ? 'carpet' : 'sheet vinyl'} is laid straight, in drops from the roll; choose the straight layout`
		};
	// Nails need wood to hold: solid hardwood is not nailed to a slab (NWFA installation
	// guidelines, memory); it is glued, floated, or laid over a nailable panel subfloor first.
	if (
		product.kind === 'hardwood' &&
		(product.fastening ?? 'nailed') === 'nailed' &&
		room.subfloor.kind === 'concrete'
	)
		return {
			path: `${path}.floor.productId`,
			roomId: room.id,
			message: `${label}: nailed solid hardwood cannot be fastened to a concrete slab; choose a glued or floating floor, or lay a nailable plywood subfloor over the slab first and measure the room as plywood`
		};
	if (shape.areaSqFt < 4)
		result.warnings.push(
			`The room measures ${shape.areaSqFt.toFixed(2)} ft²: check the measure (rooms under 4 ft² are usually a typing slip)`
		);
	return { shape, product };
}

/**
 * Leveller pours against the product's data sheet: a low spot shallower than its minimum is
 * poured at the minimum (and so counted); one deeper than its maximum is refused, naming the
 * limit, never silently priced.
 */
function pourDepths(
	ctx: RoomContext,
	areas: { areaSqFt: number; depthIn: number }[],
	index: PriceIndex
): { error?: EstimateError; warnings: string[] } {
	const supply = index.supplies.get('leveller');
	const warnings: string[] = [];
	if (!supply || areas.length === 0) return { warnings };
	const min = supply.minDepthIn;
	const max = supply.maxDepthIn;
	for (const a of areas) {
		if (max !== undefined && a.depthIn > max + 1e-9)
			return {
				warnings,
				error: {
					path: `${ctx.path}.readings.flatness`,
					roomId: ctx.room.id,
					message: `${ctx.room.name}: a low spot needs a pour about ${formatLength(a.depthIn, 'in')} deep; ${supply.name} allows at most ${formatLength(max, 'in')} a pour (its data sheet). Build it up in lifts or with another product, and measure again.`
				}
			};
		if (min !== undefined && a.depthIn < min - 1e-9) {
			warnings.push(
				`A low spot of about ${formatLength(a.depthIn, 'in')} is poured at ${supply.name}'s minimum ${formatLength(min, 'in')} (its data sheet)`
			);
			a.depthIn = min;
		}
	}
	return { warnings };
}

/** One room through its steps: takeoff, repairs, checks, cover, supplies and pricing. */
function roomSteps(
	ctx: RoomContext,
	index: PriceIndex,
	result: RoomResult,
	roomName: (roomId: string) => string | undefined
): RoomOutcome {
	const floor = floorTakeoff(ctx);
	if (!floor.ok) return { result, errors: [floor.error], findings: [], hours: [], cautions: [] };
	result.floor = floor.floor;
	const roll = floor.floor.roll;
	// Seams on the drawing where the layout put them: only where floor lies on both sides.
	// The outline was made for this room alone (readyRoom), so it takes its seams in place: a
	// spread copy of it per room showed in the benchmark's profile.
	if (roll && result.outline && roll.seams > 0) result.outline.seams = roll.seamLines;
	const repairs = repairsStep(ctx);
	result.holes = repairs.holes;
	append(result.warnings, repairs.warnings);
	const checks = checksStep(ctx);
	for (const f of checks.findings) result.findingIds.push(f.id);
	append(result.warnings, checks.warnings);
	const pour = pourDepths(ctx, checks.levelAreas, index);
	if (pour.error) return { result, errors: [pour.error], findings: [], hours: [], cautions: [] };
	append(result.warnings, pour.warnings);
	const cover = coverTakeoff(ctx, repairs.holes);
	if (cover.underlayment) result.underlayment = cover.underlayment;
	const extras = extrasTakeoff(ctx, floor.floor.roll);
	append(result.warnings, extras.warnings);
	const doors = doorChecks(ctx.room.doorways ?? [], buildUpIn(ctx.product, ctx.newUnderlayment));
	const supplies = supplyTakeoff(repairs.voids, checks.levelAreas, index, ctx);
	if (supplies.patch) result.patch = supplies.patch;
	if (supplies.leveller) result.leveller = supplies.leveller;

	const events: NeedEvent[] = [];
	append(events, repairs.needs);
	append(events, checks.needs);
	append(events, cover.needs);
	// Primer goes on before any leveller is poured (the leveller's data sheet governs).
	if (checks.levelAreas.length > 0)
		events.push({
			kind: 'primer',
			measures: { sqft: checks.levelAreas.reduce((t, a) => t + a.areaSqFt, 0), room: 1 },
			findings: []
		});
	append(events, extras.needs);
	const needs = mergeNeeds(events);
	const prep = prepItems(needs, ctx);
	result.prep = prep.prep;
	const items: WorkItem[] = [];
	append(items, floor.requests);
	append(items, prep.requests);
	const priced = priceItems(items, index, ctx.settings, roomName);
	result.ok = priced.errors.length === 0;
	for (const k of priced.skipped) result.warnings.push(k.message);
	// Tie each finding to the prep lines it called for.
	needs.forEach((need, k) => {
		const line = priced.itemLines[floor.requests.length + k];
		if (line) for (const f of need.findings) f.lineIds.push(line.id);
	});
	const hours: HoursEntry[] = [];
	append(hours, floor.hours);
	// Work the store has switched off (no price-book line) takes no time on its schedule.
	for (const h of prep.hours)
		if (!(OPTIONAL_PREP.has(h[0] as PrepKind) && !index.prep.has(h[0] as PrepKind))) hours.push(h);
	append(hours, extras.hours);
	const cautions: CautionEvent[] = [];
	append(cautions, repairs.cautions);
	append(cautions, checks.cautions);
	append(cautions, priced.cautions);
	let findings = checks.findings;
	if (doors.length > 0) {
		// A door over a raised floor: a finding tied to the undercut line the extras priced.
		const undercut = priced.lines.find((l) => l.key === 'prep:door_undercut');
		findings = [...findings];
		for (const { check, doorway } of doors) {
			const f: Finding = {
				...check,
				id: `${ctx.room.id}:door_clearance:${doorway}`,
				roomId: ctx.room.id,
				lineIds: undercut ? [undercut.id] : [],
				cautionTexts: cautionTexts(check.cautions)
			};
			findings.push(f);
			result.findingIds.push(f.id);
			if (undercut) undercut.findingIds.push(f.id);
			for (const kind of check.cautions) cautions.push({ kind, roomId: ctx.room.id });
		}
	}
	return {
		result,
		errors: priced.errors,
		findings,
		priced,
		hours,
		cautions,
		slabReadings: checks.slabReadings,
		order: {
			productId: floor.order.productId,
			cartonSqFt: floor.order.cartonSqFt,
			rollCutIn: floor.order.rollCutIn,
			panelSqFt: cover.panelSqFt,
			voids: repairs.voids,
			levelAreas: checks.levelAreas
		}
	};
}

/** Each caution once, in a fixed order, with the rooms and lines that raised it. */
function cautionNotes(events: readonly CautionEvent[]): CautionNote[] {
	const seen = new Map<CautionKind, { roomIds: Set<string>; lineIds: Set<string> }>();
	// Events come room by room, many of a kind in a row: the last note and room are remembered
	// (adding a room a set already holds changes nothing, so skipping it gives the same sets).
	let lastKind: CautionKind | undefined;
	let note: { roomIds: Set<string>; lineIds: Set<string> } | undefined;
	let lastRoomId: string | undefined;
	for (const e of events) {
		if (e.kind !== lastKind || !note) {
			lastKind = e.kind;
			lastRoomId = undefined;
			note = seen.get(e.kind);
			if (!note) {
				note = { roomIds: new Set(), lineIds: new Set() };
				seen.set(e.kind, note);
			}
		}
		if (e.roomId && e.roomId !== lastRoomId) {
			note.roomIds.add(e.roomId);
			lastRoomId = e.roomId;
		}
		if (e.lineId) note.lineIds.add(e.lineId);
	}
	return CAUTION_KINDS.filter((k) => seen.has(k)).map((kind) => ({
		kind,
		text: CAUTIONS[kind],
		roomIds: [...seen.get(kind)!.roomIds],
		lineIds: [...seen.get(kind)!.lineIds]
	}));
}

/**
 * Each slab's tests counted once for its whole area (ASTM F2170 §10.1, F1869: secondary), listed
 * with its first room: the finding, the tests still needed and the waits before they are read.
 */
function slabsStep(so: JobSoFar, s: EstimateInput['settings'], index: PriceIndex): void {
	const waits = s.schedule.testWaitHours ?? { rh: 24, calciumChloride: 72 };
	for (const slab of so.slabs.values()) {
		const checks = slabTestChecks(slab, s.moisture, waits);
		if (checks.length === 0) continue;
		const room = so.rooms[slab.roomIndex];
		let missing = 0;
		const findings: Finding[] = [];
		checks.forEach((c, n) => {
			const f: Finding = {
				...c,
				id: `${slab.roomId}:${c.check}:slab${n}`,
				roomId: slab.roomId,
				lineIds: [],
				cautionTexts: cautionTexts(c.cautions)
			};
			so.findings.push(f);
			room.findingIds.push(f.id);
			findings.push(f);
			for (const k of c.cautions) so.cautions.push({ kind: k, roomId: slab.roomId });
			if (!c.pass) {
				missing += c.limit - c.measured;
				so.hours.push([
					`wait:${c.check === 'moisture_rh_tests' ? 'rh' : 'calciumChloride'}`,
					c.check === 'moisture_rh_tests' ? waits.rh : waits.calciumChloride
				]);
			}
		});
		if (missing <= 0) continue;
		const measures = { each: missing, room: 1, hour: 0 };
		measures.hour = prepHours('moisture_test', measures, s);
		so.hours.push(['moisture_test', measures.hour]);
		const p = priceItems(
			[
				{
					ref: { type: 'prep', kind: 'moisture_test' },
					roomId: slab.roomId,
					qty: 0,
					description: `${PREP.moisture_test.label} — ${slab.label}`,
					findingIds: findings.filter((f) => !f.pass).map((f) => f.id),
					path: 'priceBook.prep',
					measures
				}
			],
			index,
			s,
			() => room.name
		);
		const line = p.itemLines[0];
		if (line) for (const f of findings) if (!f.pass) f.lineIds.push(line.id);
		room.prep.push({ kind: 'moisture_test', qty: measures });
		so.priced.push(p);
		append(so.errors, p.errors);
	}
}

/**
 * The store's minimum job charge: when the lines come to less, a line for the difference (a
 * price-book item the store may switch off or reprice; common practice).
 */
function minimumCharge(priced: Priced[], index: PriceIndex, s: EstimateInput['settings']): void {
	const min = index.prep.get('minimum_job');
	if (!min || min.priceCents <= 0) return;
	let sum = 0;
	for (const p of priced) for (const l of p.lines) sum += l.amountCents;
	if (sum >= min.priceCents) return;
	const shortfall = min.priceCents - sum;
	const out = priceItems([], index, s, () => undefined);
	const r = priceQty(
		{
			ref: { type: 'prep', kind: 'minimum_job' },
			qty: 1,
			description: `${PREP.minimum_job.label} (the job comes to less than the store's minimum)`
		},
		{
			group: 'prep',
			name: PREP.minimum_job.label,
			basis: 'each',
			unitCents: shortfall,
			payCents: 0
		},
		s
	);
	out.lines.push(r.line);
	priced.push(out);
}

/** The rooms once each is through its steps, with what they add to the job. */
interface JobSoFar {
	errors: EstimateError[];
	rooms: RoomResult[];
	findings: Finding[];
	priced: Priced[];
	hours: HoursEntry[];
	cautions: CautionEvent[];
	order: JobOrder;
	/** Roll drops laid out in every room, both ways. */
	drops: number;
	/** Concrete slabs, by id: the rooms on each and the tests taken on it. */
	slabs: Map<string, SlabSoFar>;
}

interface SlabSoFar {
	label: string;
	/** The first room on the slab: the slab's findings and tests are listed with it. */
	roomId: string;
	roomIndex: number;
	areaSqFt: number;
	rh: number;
	cc: number;
	/** A floor with a moisture limit goes on it: with no test taken, its RH tests are priced. */
	needsTests: boolean;
	thicknessIn?: number;
	drying?: 'top' | 'both';
}

/**
 * Every room through its steps, in order. A room that cannot be priced, or is beyond the
 * engine's limits, is an error; the others still price.
 */
function roomsStep(input: EstimateInput, index: PriceIndex): JobSoFar {
	const { job, settings: s, priceBook } = input;
	const names = new Map<string, string>();
	for (const r of job.rooms) if (!names.has(r.id)) names.set(r.id, r.name);
	const roomName = (id: string) => names.get(id);
	const so: JobSoFar = {
		errors: [],
		rooms: [],
		findings: [],
		priced: [],
		hours: [],
		cautions: [{ kind: 'planning_aid' }],
		order: { cartonSqFt: new Map(), rollCutIn: new Map(), panelSqFt: 0, voids: [], levelAreas: [] },
		drops: 0,
		slabs: new Map()
	};
	const seen = new Set<string>();
	job.rooms.forEach((room, i) => {
		const result = emptyRoom(room);
		so.rooms.push(result);
		if (seen.has(room.id)) {
			so.errors.push({
				path: `job.rooms.${i}.id`,
				roomId: room.id,
				message: `Room id "${room.id}" is used twice`
			});
			return;
		}
		seen.add(room.id);
		let out: RoomOutcome;
		try {
			const ready = readyRoom(room, i, input, index, result);
			if (!('shape' in ready)) {
				so.errors.push(ready);
				return;
			}
			const k = priceBook.floors.indexOf(ready.product);
			const ctx = roomContext(room, i, ready.shape, ready.product, k, s, job.builtYear);
			out = roomSteps(ctx, index, result, roomName);
		} catch (e) {
			if (!(e instanceof LimitError)) throw e;
			so.rooms[i] = emptyRoom(room);
			so.errors.push(limitError(e, room.id));
			return;
		}
		const roll = out.result.floor?.roll;
		if (roll) so.drops += roll.drops.length + roll.other.drops.length;
		append(so.errors, out.errors);
		append(so.findings, out.findings);
		append(so.hours, out.hours);
		append(so.cautions, out.cautions);
		if (out.priced) so.priced.push(out.priced);
		if (out.slabReadings) {
			const slab = room.subfloor.slab ?? {};
			const key = slab.id !== undefined ? `slab:${slab.id}` : `room:${room.id}`;
			let had = so.slabs.get(key);
			if (!had) {
				had = {
					label: slab.id !== undefined ? `Slab ${slab.id}` : room.name,
					roomId: room.id,
					roomIndex: i,
					areaSqFt: 0,
					rh: 0,
					cc: 0,
					needsTests: false
				};
				so.slabs.set(key, had);
			}
			had.areaSqFt += out.result.areaSqFt;
			had.rh += out.slabReadings.rh;
			had.cc += out.slabReadings.cc;
			had.needsTests ||= out.slabReadings.needsTests;
			had.thicknessIn ??= slab.thicknessIn;
			had.drying ??= slab.drying;
		}
		const o = out.order;
		if (o) {
			const { cartonSqFt, rollCutIn } = so.order;
			if (o.cartonSqFt !== undefined)
				cartonSqFt.set(o.productId, (cartonSqFt.get(o.productId) ?? 0) + o.cartonSqFt);
			if (o.rollCutIn !== undefined)
				rollCutIn.set(o.productId, (rollCutIn.get(o.productId) ?? 0) + o.rollCutIn);
			so.order.panelSqFt += o.panelSqFt;
			append(so.order.voids, o.voids);
			append(so.order.levelAreas, o.levelAreas);
		}
	});
	return so;
}

/**
 * The job's materials rounded up once, its totals, margin, schedule and cautions. Work adding up
 * past a limit (roll drops, hours, a line's amount) refuses the whole job.
 */
function jobStep(so: JobSoFar, input: EstimateInput, index: PriceIndex): EstimateResult {
	const s = input.settings;
	const { errors, priced, cautions } = so;
	try {
		if (so.drops > LIMITS.jobDrops)
			throw new LimitError(
				'job.rooms',
				LIMITS.jobDrops,
				`The rooms' roll goods come to ${so.drops} drops; the engine lays out up to ${LIMITS.jobDrops} a job`
			);
		slabsStep(so, s, index);
		const materials = materialItems(so.order, index, s);
		const jobItems = materials.items;
		const supplies = installSupplies(input.job, so.rooms, index, s);
		append(jobItems, supplies.items);
		append(cautions, supplies.cautions);
		// A trip charge once a job, where the store's price book has one (it may switch it off).
		if (index.prep.has('trip_charge'))
			jobItems.push({
				ref: { type: 'prep', kind: 'trip_charge' },
				qty: 1,
				description: PREP.trip_charge.label,
				path: 'priceBook.prep'
			});
		const jobPriced = priceItems(jobItems, index, s, () => undefined);
		priced.push(jobPriced);
		append(errors, jobPriced.errors);
		append(cautions, materials.cautions);
		minimumCharge(priced, index, s);
		const lines: PriceLine[] = [];
		const pay: PayLine[] = [];
		let costCents = 0;
		let costComplete = true;
		for (const p of priced) {
			append(lines, p.lines);
			append(pay, p.pay);
			costCents += p.costCents;
			costComplete &&= p.costComplete;
		}
		const sum = totals(lines, s);
		const installerPayCents = pay.reduce((t, p) => t + p.amountCents, 0);
		const schedule = placed(
			() => scheduleStep(hoursByKey(so.hours), s),
			(field) => (field.startsWith('steps') ? 'job.rooms' : `settings.schedule.${field}`)
		);
		const warnings: { roomId?: string; message: string }[] = [];
		for (const r of so.rooms)
			for (const message of r.warnings) warnings.push({ roomId: r.id, message });
		return {
			ok: errors.length === 0,
			errors,
			rooms: so.rooms,
			findings: so.findings,
			lines,
			pay,
			totals: sum,
			installerPayCents,
			margin: margin(sum.subtotalCents, installerPayCents, costCents, costComplete),
			schedule,
			cautions: cautionNotes(cautions),
			warnings
		};
	} catch (e) {
		if (!(e instanceof LimitError)) throw e;
		errors.push(limitError(e));
		return refused(errors);
	}
}

/**
 * Estimates a whole job: every room through its steps (`roomsStep`), then the job's materials,
 * totals and schedule (`jobStep`). Never throws for bad measures or missing prices: they come
 * back in `errors` with the path of the field at fault. Work beyond the engine's `LIMITS` is
 * refused the same way, its error marked with the `limit` passed: a room beyond them is left out
 * (the others still price); a job beyond them gets nothing priced.
 */
export function estimate(input: EstimateInput): EstimateResult {
	let index: PriceIndex;
	try {
		checkJob(input);
		index = placed(
			() => new PriceIndex(input.priceBook),
			(field) => `priceBook.${field}`
		);
	} catch (e) {
		if (e instanceof LimitError) return refused([limitError(e)]);
		throw e;
	}
	return jobStep(roomsStep(input, index), input, index);
}

/** What the customer sees: prices and totals, never installer pay or margins. */
export function forCustomer(r: EstimateResult) {
	return {
		rooms: r.rooms.map(({ id, name, areaSqFt, outline }) => ({ id, name, areaSqFt, outline })),
		findings: r.findings.map(
			({ id, roomId, check, pass, message, suggestedPrep, cautionTexts }) => ({
				id,
				roomId,
				check,
				pass,
				message,
				suggestedPrep,
				cautionTexts
			})
		),
		lines: r.lines,
		totals: r.totals,
		// The order of work and its waits (tests, cures, acclimation): no hours of labour or pay.
		schedule: {
			days: r.schedule.days,
			steps: r.schedule.steps.map((s) => ({
				key: s.key,
				label: s.label,
				...(s.cureHours ? { waitHours: s.cureHours } : {})
			}))
		},
		cautions: r.cautions.map((c) => c.text)
	};
}

/** What the installer sees: rooms, quantities, prep, pay and schedule; never prices or margins. */
export function forInstaller(r: EstimateResult) {
	return {
		rooms: r.rooms,
		findings: r.findings,
		work: r.lines.map(({ id, roomId, description, basis, qty, group }) => ({
			id,
			roomId,
			description,
			basis,
			qty,
			group
		})),
		pay: r.pay,
		installerPayCents: r.installerPayCents,
		schedule: r.schedule,
		cautions: r.cautions.map((c) => c.text)
	};
}
