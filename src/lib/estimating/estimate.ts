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
import {
	margin,
	PriceIndex,
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
import { coverTakeoff, floorTakeoff, supplyTakeoff } from './steps/takeoff';
import type {
	CautionNote,
	EstimateError,
	EstimateInput,
	EstimateResult,
	Finding,
	RoomMeasure,
	RoomResult
} from './types';

/** Appends without spreading a list of any length into a call. */
function append<T>(to: T[], items: readonly T[]): void {
	for (const x of items) to.push(x);
}

/** What one room brings to the job. */
interface RoomOutcome {
	result: RoomResult;
	errors: EstimateError[];
	findings: Finding[];
	priced?: Priced;
	hours: HoursEntry[];
	cautions: CautionEvent[];
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
	return { shape, product };
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
	const repairs = repairsStep(ctx);
	result.holes = repairs.holes;
	const checks = checksStep(ctx);
	for (const f of checks.findings) result.findingIds.push(f.id);
	append(result.warnings, checks.warnings);
	const cover = coverTakeoff(ctx, repairs.holes);
	if (cover.underlayment) result.underlayment = cover.underlayment;
	const supplies = supplyTakeoff(repairs.voids, checks.levelAreas, index, ctx);
	if (supplies.patch) result.patch = supplies.patch;
	if (supplies.leveller) result.leveller = supplies.leveller;

	const events: NeedEvent[] = [];
	append(events, repairs.needs);
	append(events, checks.needs);
	append(events, cover.needs);
	const needs = mergeNeeds(events);
	const prep = prepItems(needs, ctx);
	result.prep = prep.prep;
	const items: WorkItem[] = [];
	append(items, floor.requests);
	append(items, prep.requests);
	const priced = priceItems(items, index, ctx.settings, roomName);
	result.ok = priced.errors.length === 0;
	// Tie each finding to the prep lines it called for.
	needs.forEach((need, k) => {
		const line = priced.itemLines[floor.requests.length + k];
		if (line) for (const f of need.findings) f.lineIds.push(line.id);
	});
	const hours: HoursEntry[] = [];
	append(hours, floor.hours);
	append(hours, prep.hours);
	const cautions: CautionEvent[] = [];
	append(cautions, repairs.cautions);
	append(cautions, checks.cautions);
	append(cautions, priced.cautions);
	return {
		result,
		errors: priced.errors,
		findings: checks.findings,
		priced,
		hours,
		cautions,
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
	for (const e of events) {
		let note = seen.get(e.kind);
		if (!note) {
			note = { roomIds: new Set(), lineIds: new Set() };
			seen.set(e.kind, note);
		}
		if (e.roomId) note.roomIds.add(e.roomId);
		if (e.lineId) note.lineIds.add(e.lineId);
	}
	return CAUTION_KINDS.filter((k) => seen.has(k)).map((kind) => ({
		kind,
		text: CAUTIONS[kind],
		roomIds: [...seen.get(kind)!.roomIds],
		lineIds: [...seen.get(kind)!.lineIds]
	}));
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
		drops: 0
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
		const materials = materialItems(so.order, index, s);
		const jobPriced = priceItems(materials.items, index, s, () => undefined);
		priced.push(jobPriced);
		append(errors, jobPriced.errors);
		append(cautions, materials.cautions);
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
		schedule: { days: r.schedule.days },
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
