// The work order: what the installer needs on site, taken from the job's accepted quote (the
// engine's rooms, lines, findings, schedule and cautions) with no price, cost, pay or margin in
// it. The screen, the installer's PDF and the desk's PDF all read this one shape.
import { PREP, refKey, type Basis, type ItemRef, type Outline } from '$lib/estimating';
import { WORK_STEPS } from '$lib/estimating/steps/schedule';
import { jobLabel, type JobStatus } from '$lib/jobs/status';
import * as field from '../db/queries/field';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import type { StoreTx } from '../db/tenant';

/**
 * Said on every work order: the app plans, the maker's instructions, codes and licensed people
 * decide (../shared/PRODUCT.md, "Safety").
 */
export const STANDING_CAUTIONS = [
	'Old sheet vinyl, vinyl tiles and black adhesive laid before the 1980s may contain asbestos: do not sand, scrape dry or break them up until a test says they are free of it; follow local rules and use a licensed abatement contractor where they require one.',
	'Structure: sagging, bouncy or cut joists and any change to framing go to a licensed professional before the floor goes down.',
	'Dust and tools: cut and grind with dust extraction or wet methods, wear a fitted respirator, eye and hearing protection, and keep saws and grinders guarded.',
	"The flooring maker's installation instructions and local building codes govern every method, limit and wait on this sheet."
];

const MOISTURE_CHECKS = new Set([
	'moisture_rh',
	'moisture_rh_tests',
	'moisture_mver',
	'moisture_mver_tests',
	'wood_subfloor_mc',
	'wood_mc_difference'
]);

export interface WorkOrderRoom {
	id: string;
	name: string;
	areaSqFt: number;
	outline?: Outline;
	floor: { name: string; kind: string; layout: string } | null;
	subfloor: string;
	remove: string[];
	underlayment: {
		panels: number;
		fasteners: number;
		fastenersPerPanel: number;
		schedule: {
			name: string;
			edgeSpacingIn: number;
			fieldSpacingIn: number;
			edgeDistanceIn: number;
			source: string;
		};
	} | null;
}

export interface WorkOrderLine {
	description: string;
	roomName: string | null;
	qty: number;
	basis: Basis;
}

export interface WorkOrderStep {
	key: string;
	label: string;
	hours: number;
	cureHours: number;
	lines: (WorkOrderLine & { method: string })[];
}

export interface WorkOrderReading {
	roomName: string;
	what: string;
	rule: string;
	limit: number;
	unit: string;
	measured: string;
	pass: boolean;
	source: string;
}

export interface WorkOrder {
	job: { id: string; label: string; title: string; status: JobStatus; notes: string };
	customer: { name: string; phone: string | null };
	site: { address: string; town: string; postcode: string; access: string } | null;
	booking: {
		startsOn: string;
		endsOn: string | null;
		days: number;
		arrivesAt: string | null;
		notes: string;
	} | null;
	builtYear: number | null;
	/** Whether an accepted quote was found (without one, only the contact part is filled). */
	quoted: boolean;
	rooms: WorkOrderRoom[];
	materials: WorkOrderLine[];
	steps: WorkOrderStep[];
	readings: WorkOrderReading[];
	/**
	 * The other checks (joists, spans and deflection, sheathing, tile over wood): the installer's
	 * structural notes, kept off the customer's papers (`$lib/papers/audience`).
	 */
	structure: WorkOrderReading[];
	cautions: string[];
}

/** Which quote line a prep or removal ref belongs to in the order of work. */
function stepKeyOf(ref: ItemRef): string | undefined {
	const kind = ref.type === 'prep' ? ref.kind : ref.type === 'removal' ? 'removal' : undefined;
	if (!kind) return undefined;
	return WORK_STEPS.find((s) => s.kinds.includes(kind))?.key;
}

function methodOf(ref: ItemRef, room: WorkOrderRoom | undefined): string {
	if (ref.type === 'removal') return `Tear out ${ref.existing.replaceAll('_', ' ')}.`;
	if (ref.type !== 'prep') return '';
	const base = PREP[ref.kind]?.label ?? ref.kind;
	if (ref.kind === 'underlayment' && room?.underlayment) {
		const s = room.underlayment.schedule;
		return `${base}: fasten every ${s.edgeSpacingIn} in on the edges and ${s.fieldSpacingIn} in in the field, ${s.edgeDistanceIn} in from the edge (${s.name}; ${s.source}).`;
	}
	return base;
}

/** The work order of a job the viewer may see; undefined when the job is not theirs. */
export async function readWorkOrder(
	tx: StoreTx,
	jobId: string,
	viewer: jobs.JobViewer
): Promise<WorkOrder | undefined> {
	const job = await jobs.readForViewer(tx, jobId, viewer);
	if (!job) return undefined;
	const [site, booked, q] = [
		await field.readSite(tx, jobId),
		await field.readBooking(tx, jobId),
		await quotes.accepted(tx, jobId)
	];
	const order: WorkOrder = {
		job: {
			id: job.id,
			label: jobLabel(job.number),
			title: job.title,
			status: job.status,
			notes: job.notes
		},
		customer: { name: job.customerName, phone: job.customerPhone },
		site: site
			? { address: site.address, town: site.town, postcode: site.postcode, access: site.notes }
			: null,
		booking: booked
			? {
					startsOn: booked.startsOn,
					endsOn: booked.endsOn,
					days: booked.days,
					arrivesAt: booked.arrivesAt,
					notes: booked.notes
				}
			: null,
		builtYear: null,
		quoted: Boolean(q),
		rooms: [],
		materials: [],
		steps: [],
		readings: [],
		structure: [],
		cautions: [...STANDING_CAUTIONS]
	};
	if (!q) return order;
	const { input, result } = q;
	order.builtYear = input.job.builtYear ?? null;
	const floors = new Map(input.priceBook.floors.map((f) => [f.id, f]));
	const measured = new Map(input.job.rooms.map((r) => [r.id, r]));
	order.rooms = result.rooms.map((r) => {
		const m = measured.get(r.id);
		const product = m?.floor ? floors.get(m.floor.productId) : undefined;
		return {
			id: r.id,
			name: r.name,
			areaSqFt: r.areaSqFt,
			outline: r.outline,
			floor: m?.floor
				? {
						name: product?.name ?? 'Floor',
						kind: (product?.kind ?? '').replaceAll('_', ' '),
						layout: m.floor.layout
					}
				: null,
			subfloor: m ? m.subfloor.kind.replaceAll('_', ' ') : '',
			remove: (m?.remove ?? []).map((k) => k.replaceAll('_', ' ')),
			underlayment: r.underlayment
				? {
						panels: r.underlayment.panels,
						fasteners: r.underlayment.fasteners,
						fastenersPerPanel: r.underlayment.fastenersPerPanel,
						schedule: {
							name: r.underlayment.schedule.name,
							edgeSpacingIn: r.underlayment.schedule.edgeSpacingIn,
							fieldSpacingIn: r.underlayment.schedule.fieldSpacingIn,
							edgeDistanceIn: r.underlayment.schedule.edgeDistanceIn,
							source: r.underlayment.schedule.source
						}
					}
				: null
		};
	});
	const roomOf = new Map(order.rooms.map((r) => [r.id, r]));
	// Only what the line is and how much: never its price.
	const lineOf = (l: (typeof result.lines)[number]): WorkOrderLine => ({
		description: l.description,
		roomName: l.roomId ? (roomOf.get(l.roomId)?.name ?? null) : null,
		qty: l.qty,
		basis: l.basis
	});
	order.materials = result.lines.filter((l) => l.group === 'material').map(lineOf);
	const scheduled = new Map(result.schedule.steps.map((s) => [s.key, s]));
	order.steps = WORK_STEPS.map((step) => {
		const s = scheduled.get(step.key);
		const lines = result.lines
			.filter((l) => (l.group === 'prep' || l.group === 'removal') && stepKeyOf(l.ref) === step.key)
			.map((l) => ({
				...lineOf(l),
				method: methodOf(l.ref, l.roomId ? roomOf.get(l.roomId) : undefined)
			}));
		return {
			key: step.key,
			label: step.label,
			hours: s?.hours ?? 0,
			cureHours: s?.cureHours ?? 0,
			lines
		};
	}).filter((s) => s.lines.length > 0 || s.hours > 0);
	const isReading = (check: string) => check === 'flatness' || MOISTURE_CHECKS.has(check);
	const noteOf = (f: (typeof result.findings)[number]): WorkOrderReading => ({
		roomName: roomOf.get(f.roomId)?.name ?? '',
		what: f.message,
		rule: f.rule,
		limit: f.limit,
		unit: f.unit,
		measured: String(f.measured),
		pass: f.pass,
		source: f.source
	});
	order.structure = result.findings.filter((f) => !isReading(f.check)).map(noteOf);
	order.readings = result.findings
		.filter((f) => isReading(f.check))
		.map((f) => ({
			roomName: roomOf.get(f.roomId)?.name ?? '',
			what: f.message,
			rule: f.rule,
			limit: f.limit,
			unit: f.unit,
			measured: String(f.measured),
			pass: f.pass,
			source: f.source
		}));
	order.cautions = [...new Set([...result.cautions.map((c) => c.text), ...STANDING_CAUTIONS])];
	return order;
}

export interface ReportChoice {
	refKey: string;
	ref: ItemRef;
	label: string;
	unit: Basis;
}

/**
 * What the installer can record as found, per room: the quote's prep and removal items and the
 * price book's prep kinds (a hole nobody saw at the measure is still "close subfloor hole"), in
 * the units the quote prices them by, each with the amount sold beside it.
 */
export async function reportChoices(tx: StoreTx, jobId: string) {
	const q = await quotes.accepted(tx, jobId);
	const items = new Map<string, ReportChoice>();
	const sold = new Map<string, number>();
	const rooms: { id: string; name: string }[] = [];
	if (q) {
		for (const r of q.result.rooms) rooms.push({ id: r.id, name: r.name });
		for (const l of q.result.lines) {
			if (l.group !== 'prep' && l.group !== 'removal') continue;
			const key = refKey(l.ref);
			if (!items.has(key))
				items.set(key, { refKey: key, ref: l.ref, label: l.description, unit: l.basis });
			const soldKey = `${l.roomId ?? ''}|${key}`;
			sold.set(soldKey, (sold.get(soldKey) ?? 0) + l.qty);
		}
		for (const p of q.input.priceBook.prep) {
			const ref: ItemRef = { type: 'prep', kind: p.kind };
			const key = refKey(ref);
			if (!items.has(key))
				items.set(key, {
					refKey: key,
					ref,
					label: p.name || PREP[p.kind]?.label || p.kind,
					unit: p.basis
				});
		}
	}
	// The prep kind's own words, not the line's (which may name a room).
	for (const c of items.values())
		if (c.ref.type === 'prep') c.label = PREP[c.ref.kind]?.label ?? c.label;
	return {
		rooms,
		roomIds: new Set(rooms.map((r) => r.id)),
		items,
		/** Sold amount by `${roomId ?? ''}|${refKey}`. */
		sold
	};
}
