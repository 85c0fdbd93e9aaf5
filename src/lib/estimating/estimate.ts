/**
 * The whole job: geometry, takeoff, checks, prep, prices, pay, margin and duration.
 * Bad input becomes an error entry naming the room and field; the other rooms still price.
 */
import { CAUTION_KINDS, CAUTIONS, cautionTexts, type CautionKind } from './cautions';
import { roomOutline, roomShape, type RoomShape } from './geometry';
import type {
	CautionNote,
	EstimateError,
	EstimateInput,
	EstimateResult,
	Finding,
	RoomMeasure,
	RoomResult
} from './index';
import { ceilUnits } from './math';
import { PREP, type Measures, type PrepKind } from './prep';
import {
	margin,
	PriceIndex,
	priceQty,
	totals,
	type FloorProduct,
	type ItemRef,
	type PayLine,
	type PriceLine
} from './pricing';
import { schedule, type WorkStep } from './schedule';
import { ROLL_KINDS, type FloorKind, type StoreSettings } from './settings';
import {
	flatnessCheck,
	flatnessRules,
	joistCheck,
	mverChecks,
	rhChecks,
	sheathingChecks,
	woodMoistureChecks,
	type Check
} from './substrate';
import {
	cartonTakeoff,
	holeRepair,
	levellerTakeoff,
	patchTakeoff,
	rollTakeoff,
	underlaymentTakeoff,
	type Void
} from './takeoff';

/** A prep item a room needs, with its quantity in every measure it can be priced by. */
interface PrepNeed {
	kind: PrepKind;
	measures: Measures;
	findings: Finding[];
}

const ADDITIVE = new Set<PrepKind>(['level', 'grind', 'moisture_test']);

const ASBESTOS_FLOORS = new Set(['sheet_vinyl', 'vinyl_tile', 'ceramic_tile', 'hardwood_glued']);

/** Work steps in install order; a step's cure holds the next. */
const STEPS: { key: string; label: string; kinds: string[] }[] = [
	{ key: 'removal', label: 'Tear out existing floors', kinds: ['removal'] },
	{ key: 'fasteners', label: 'Pull fasteners, sweep, vacuum', kinds: ['fastener_removal'] },
	{ key: 'structure', label: 'Structure', kinds: ['structural_consult', 'joist_sister'] },
	{ key: 'holes', label: 'Close subfloor holes', kinds: ['hole_repair'] },
	{ key: 'overlay', label: 'Subfloor overlay', kinds: ['subfloor_overlay'] },
	{ key: 'underlayment', label: 'Underlayment panels', kinds: ['underlayment'] },
	{ key: 'grind', label: 'Grind high spots', kinds: ['grind'] },
	{ key: 'patch', label: 'Patch seams and dents', kinds: ['seam_patch', 'dent_patch'] },
	{ key: 'level', label: 'Level low spots', kinds: ['level'] },
	{
		key: 'moisture',
		label: 'Moisture',
		kinds: ['moisture_test', 'moisture_retest', 'moisture_barrier']
	},
	{ key: 'install', label: 'Install floors', kinds: ['install'] },
	{ key: 'finish', label: 'Trim and transitions', kinds: ['trim', 'transition'] }
];

const isWood = (kind: string) => kind !== 'concrete';

function ratioFor(kind: FloorKind, product: FloorProduct, s: StoreSettings): number {
	return product.needs?.deflectionRatio ?? s.joists.ratio[kind] ?? s.joists.defaultRatio;
}

/** Joists under a room: its extent across them ÷ spacing, plus one. */
function joistCount(room: RoomShape, runs: 'x' | 'y' | undefined, spacingIn: number): number {
	const { widthIn, lengthIn } = room.bbox;
	const along = runs ?? (widthIn <= lengthIn ? 'x' : 'y');
	const across = along === 'x' ? lengthIn : widthIn;
	return Math.floor(across / spacingIn) + 1;
}

/**
 * Estimates a whole job. Never throws for bad measures or missing prices: they come back in
 * `errors` with the path of the field at fault.
 */
export function estimate(input: EstimateInput): EstimateResult {
	const { job, settings: s, priceBook } = input;
	const index = new PriceIndex(priceBook);
	const errors: EstimateError[] = [];
	const warnings: { roomId?: string; message: string }[] = [];
	const findings: Finding[] = [];
	const rooms: RoomResult[] = [];
	const lines: PriceLine[] = [];
	const pay: PayLine[] = [];
	const cautions = new Map<CautionKind, { roomIds: Set<string>; lineIds: Set<string> }>();
	let costCents = 0;
	let costComplete = true;
	const hours = new Map<string, number>();
	const addHours = (key: string, h: number) => hours.set(key, (hours.get(key) ?? 0) + h);

	const caution = (kind: CautionKind, roomId?: string, lineId?: string) => {
		let note = cautions.get(kind);
		if (!note) {
			note = { roomIds: new Set(), lineIds: new Set() };
			cautions.set(kind, note);
		}
		if (roomId) note.roomIds.add(roomId);
		if (lineId) note.lineIds.add(lineId);
	};
	caution('planning_aid');

	const add = (
		item: {
			ref: ItemRef;
			roomId?: string;
			qty: number;
			description?: string;
			findingIds?: string[];
		},
		path: string,
		measures?: Measures
	): PriceLine | undefined => {
		const price = index.resolve(item.ref);
		if (typeof price === 'string') {
			const room = item.roomId ? job.rooms.find((r) => r.id === item.roomId) : undefined;
			errors.push({
				path,
				roomId: item.roomId,
				message: room ? `${price} (needed in ${room.name})` : price
			});
			return undefined;
		}
		let qty = item.qty;
		if (measures) {
			const m = measures[price.basis];
			if (m === undefined) {
				errors.push({
					path,
					roomId: item.roomId,
					message: `"${price.name}" is priced per ${price.basis}, which does not fit ${item.ref.type === 'prep' ? item.ref.kind : 'this item'}`
				});
				return undefined;
			}
			qty = m;
		}
		if (!(qty > 0)) return undefined;
		item.qty = qty;
		const priced = priceQty(item, price, s);
		lines.push(priced.line);
		if (priced.pay) pay.push(priced.pay);
		if (priced.costCents !== undefined) costCents += priced.costCents;
		else if (priced.line.group === 'material') costComplete = false;
		return priced.line;
	};

	// Job-level order quantities, summed over rooms and rounded up once.
	const cartonNeed = new Map<string, number>();
	const rollNeed = new Map<string, number>();
	let panelSqFt = 0;
	const patchVoids: Void[] = [];
	const levelAreas: { areaSqFt: number; depthIn: number }[] = [];

	const seen = new Set<string>();
	job.rooms.forEach((room, i) => {
		const path = `job.rooms.${i}`;
		const result: RoomResult = {
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
		rooms.push(result);
		if (seen.has(room.id)) {
			errors.push({
				path: `${path}.id`,
				roomId: room.id,
				message: `Room id "${room.id}" is used twice`
			});
			return;
		}
		seen.add(room.id);
		const label = room.name || `Room ${i + 1}`;
		const shape = roomShape(room.shape, room.cutouts, {
			closureToleranceIn: s.geometry.closureToleranceIn
		});
		if (!shape.ok) {
			errors.push({
				path: `${path}.${shape.field}`,
				roomId: room.id,
				message: `${label}: ${shape.message}`
			});
			return;
		}
		result.areaSqFt = shape.areaSqFt;
		result.perimeterIn = shape.perimeterIn;
		result.wallPerimeterIn = shape.wallPerimeterIn;
		result.outline = roomOutline(shape);
		result.warnings.push(...shape.warnings);
		if (!room.floor) {
			errors.push({ path: `${path}.floor`, roomId: room.id, message: `${label}: choose a floor` });
			return;
		}
		const product = index.floors.get(room.floor.productId);
		if (!product) {
			errors.push({
				path: `${path}.floor.productId`,
				roomId: room.id,
				message: `${label}: floor "${room.floor.productId}" is not in the price book`
			});
			return;
		}
		const roomOk = priceRoom(room, i, shape, product, result);
		result.ok = roomOk;
	});

	function priceRoom(
		room: RoomMeasure,
		i: number,
		shape: RoomShape,
		product: FloorProduct,
		result: RoomResult
	): boolean {
		const path = `job.rooms.${i}`;
		const kind = product.kind;
		const area = shape.areaSqFt;
		const errorsBefore = errors.length;
		const productPath = `priceBook.floors.${priceBook.floors.indexOf(product)}`;

		// Floor takeoff
		if (ROLL_KINDS.includes(kind)) {
			if (!(product.rollWidthIn && product.rollWidthIn > 0)) {
				errors.push({
					path: `${productPath}.rollWidthIn`,
					roomId: room.id,
					message: `${product.name}: roll width is missing`
				});
				return false;
			}
			const roll = rollTakeoff({
				polygon: shape.polygon,
				isRect: shape.isRect,
				rollWidthIn: product.rollWidthIn,
				trimPerEndIn: s.roll.trimPerEndIn,
				orderIncrementIn: s.roll.orderIncrementIn,
				direction: room.floor?.rollDirection
			});
			result.floor = { productId: product.id, kind, roll };
			rollNeed.set(product.id, (rollNeed.get(product.id) ?? 0) + roll.cutLengthIn);
		} else {
			if (!(product.cartonSqFt && product.cartonSqFt > 0)) {
				errors.push({
					path: `${productPath}.cartonSqFt`,
					roomId: room.id,
					message: `${product.name}: carton coverage is missing`
				});
				return false;
			}
			const cartons = cartonTakeoff({
				areaSqFt: area,
				wastePct: s.wastePct[room.floor!.layout],
				coverageSqFt: product.cartonSqFt
			});
			result.floor = { productId: product.id, kind, cartons };
			cartonNeed.set(product.id, (cartonNeed.get(product.id) ?? 0) + cartons.neededSqFt);
		}

		// Install labour
		add(
			{
				ref: { type: 'install', productId: product.id },
				roomId: room.id,
				qty: area,
				description: `Install ${product.name} — ${room.name}`
			},
			`${productPath}.labourCentsPerSqFt`
		);
		addHours(`install`, (area / s.schedule.crewSqFtPerDay[kind]) * s.schedule.workdayHours);

		// Tear-out
		const oldHouse = job.builtYear === undefined || job.builtYear < s.asbestosBuiltBefore;
		(room.remove ?? []).forEach((existing, k) => {
			const line = add(
				{
					ref: { type: 'removal', existing },
					roomId: room.id,
					qty: 1,
					description: `Remove ${existing.replace(/_/g, ' ')} — ${room.name}`
				},
				`${path}.remove.${k}`,
				{ sqft: area, room: 1 }
			);
			addHours('removal', area / s.schedule.removalSqFtPerHour);
			caution('dust_tools', room.id, line?.id);
			if (ASBESTOS_FLOORS.has(existing) && oldHouse) caution('asbestos', room.id, line?.id);
		});

		const needs: PrepNeed[] = [];
		// Readings add up (each low spot, each missing test); whole-room fixes count once.
		const need = (kind: PrepKind, measures: Measures, from: Finding[] = []) => {
			const had = needs.find((x) => x.kind === kind);
			if (!had) needs.push({ kind, measures, findings: [...from] });
			else {
				const additive = ADDITIVE.has(kind);
				for (const [b, v] of Object.entries(measures) as [keyof Measures, number][])
					had.measures[b] =
						additive && b !== 'room'
							? (had.measures[b] ?? 0) + v
							: Math.max(had.measures[b] ?? 0, v);
				for (const f of from) if (!had.findings.includes(f)) had.findings.push(f);
			}
		};
		const addFinding = (c: Check, n: number): Finding => {
			const f: Finding = {
				id: `${room.id}:${c.check}:${n}`,
				roomId: room.id,
				check: c.check,
				pass: c.pass,
				measured: c.measured,
				limit: c.limit,
				unit: c.unit,
				message: c.message,
				rule: c.rule,
				source: c.source,
				suggestedPrep: c.suggestedPrep,
				cautions: c.cautions,
				cautionTexts: cautionTexts(c.cautions),
				lineIds: []
			};
			findings.push(f);
			result.findingIds.push(f.id);
			for (const k of c.cautions) caution(k, room.id);
			return f;
		};

		const sub = room.subfloor;
		const wood = isWood(sub.kind);
		const spacing = room.joists?.spacingIn ?? s.repairs.defaultJoistSpacingIn;
		const newUnderlayment =
			wood &&
			(room.underlayment ??
				product.needs?.underlayment ??
				s.underlayment.requiredFor.includes(kind));
		const rep = room.repairs ?? {};

		// Fasteners left behind
		if (rep.fasteners) {
			const a = rep.fasteners === true ? area : Math.min(area, rep.fasteners.areaSqFt);
			need('fastener_removal', { sqft: a, room: 1 });
		}

		// Holes
		// Backing gives nailed wood something to nail into; glued or floating wood gets blocking.
		const woodFloor = kind === 'hardwood' || kind === 'engineered_wood';
		const nailed =
			(product.fastening ?? (kind === 'hardwood' ? 'nailed' : 'floating')) === 'nailed';
		const method = woodFloor && !nailed ? 'blocking' : s.repairs.holeMethod[kind];
		let holes = 0;
		for (const h of rep.holes ?? []) {
			const r = holeRepair({
				widthIn: h.widthIn,
				lengthIn: h.lengthIn,
				method,
				newUnderlayment,
				ignoreUnderIn: s.repairs.ignoreHoleUnderIn,
				subfloorThicknessIn: sub.thicknessIn ?? s.repairs.defaultSubfloorIn,
				joistSpacingIn: spacing,
				joistThicknessIn: s.repairs.joistThicknessIn,
				backingLapIn: s.repairs.backingLapIn,
				roughCutAllowanceIn: s.repairs.roughCutAllowanceIn
			});
			result.holes.push(r);
			if (!r.ignored) holes++;
		}
		if (holes > 0) {
			need('hole_repair', { each: holes, room: 1 });
			caution('dust_tools', room.id);
		}

		// Seams and dents → patch
		const seams = rep.seams ?? [];
		const dents = rep.dents ?? [];
		if (seams.length > 0)
			need('seam_patch', {
				linft: seams.reduce((t, v) => t + v.lengthIn, 0) / 12,
				each: seams.length,
				room: 1
			});
		if (dents.length > 0)
			need('dent_patch', {
				each: dents.length,
				sqft: dents.reduce((t, v) => t + v.lengthIn * v.widthIn, 0) / 144,
				room: 1
			});
		const roomVoids = [...seams, ...dents];

		// Joists
		let n = 0;
		if (room.joists && wood) {
			const ratio = ratioFor(kind, product, s);
			const jm = room.joists;
			const j = joistCheck(
				{ size: jm.size, species: jm.species, spacingIn: jm.spacingIn, spanIn: jm.spanIn, ratio },
				s.joists
			);
			for (const c of j.checks) {
				const f = addFinding(c, n++);
				for (const p of c.suggestedPrep)
					need(
						p.kind,
						p.kind === 'joist_sister'
							? { each: joistCount(shape, room.joists.runs, spacing), room: 1 }
							: { room: 1, each: 1 },
						[f]
					);
			}
		} else if (wood && (kind === 'ceramic_tile' || kind === 'stone_tile')) {
			result.warnings.push(
				'Joists were not measured: the deflection check for tile or stone was not run'
			);
		}

		// Sheathing
		if (wood && sub.thicknessIn !== undefined) {
			for (const c of sheathingChecks(
				{
					kind: sub.kind as 'plywood' | 'osb' | 'board',
					thicknessIn: sub.thicknessIn,
					spanRating: sub.spanRating,
					joistSpacingIn: spacing,
					floorKind: kind
				},
				s.sheathing
			)) {
				const f = addFinding(c, n++);
				for (const p of c.suggestedPrep) need(p.kind, { sqft: area, room: 1 }, [f]);
			}
		}

		// Flatness
		const roomLevel: { areaSqFt: number; depthIn: number }[] = [];
		const readings = room.readings ?? {};
		const rules =
			product.needs?.flatness ??
			flatnessRules(kind, wood ? 'wood' : 'concrete', s.flatness, product.tileEdgesIn);
		if (rules && rules.length > 0) {
			for (const r of readings.flatness ?? []) {
				const c = flatnessCheck(r, rules);
				const f = addFinding(c, n++);
				if (c.pass) continue;
				if (r.kind === 'high') need('grind', { each: 1, room: 1 }, [f]);
				else {
					const a = Math.min(area, r.areaSqFt ?? s.repairs.lowSpotAreaSqFt);
					const depth = r.gapIn * s.repairs.lowSpotDepthFactor;
					need('level', { sqft: a, sqft_per_eighth_in: a * (depth / 0.125), each: 1, room: 1 }, [
						f
					]);
					roomLevel.push({ areaSqFt: a, depthIn: depth });
				}
			}
		}

		// Moisture
		if (!wood) {
			const rh = readings.rhPct ?? [];
			const cc = readings.calciumChloride ?? [];
			if (rh.length > 0)
				for (const c of rhChecks(
					{
						readingsPct: rh,
						areaSqFt: area,
						limitPct: product.needs?.rhLimitPct ?? s.moisture.rhLimitPct
					},
					s.moisture
				)) {
					const f = addFinding(c, n++);
					for (const p of c.suggestedPrep)
						need(
							p.kind,
							p.kind === 'moisture_test' ? { each: c.limit - c.measured } : { sqft: area, room: 1 },
							[f]
						);
				}
			if (cc.length > 0)
				for (const c of mverChecks(
					{ tests: cc, areaSqFt: area, limit: product.needs?.mverLimit ?? s.moisture.mverLimit },
					s.moisture
				)) {
					const f = addFinding(c, n++);
					for (const p of c.suggestedPrep)
						need(
							p.kind,
							p.kind === 'moisture_test' ? { each: c.limit - c.measured } : { sqft: area, room: 1 },
							[f]
						);
				}
			if (rh.length === 0 && cc.length === 0 && kind !== 'carpet')
				result.warnings.push('No moisture readings for a concrete subfloor');
		} else if (readings.woodMc) {
			for (const c of woodMoistureChecks(
				{
					subfloorPct: readings.woodMc.subfloorPct,
					flooringPct: readings.woodMc.flooringPct,
					boardWidthIn: product.boardWidthIn
				},
				s.moisture
			)) {
				const f = addFinding(c, n++);
				for (const p of c.suggestedPrep) need(p.kind, { each: 1, room: 1 }, [f]);
			}
		}

		// Underlayment (after holes: resilient hole repairs call for it)
		const underlay =
			newUnderlayment || result.holes.some((h) => !h.ignored && h.needsUnderlayment && wood);
		if (underlay) {
			const u = underlaymentTakeoff({
				areaSqFt: area,
				wastePct: s.underlayment.wastePct,
				panel: { widthIn: s.underlayment.panelWidthIn, lengthIn: s.underlayment.panelLengthIn },
				schedule: s.underlayment.schedules[s.underlayment.schedule]
			});
			result.underlayment = u;
			panelSqFt += area;
			need('underlayment', { sqft: area, panel: u.panels, room: 1 });
		}

		if (room.trim) need('trim', { linft: ceilUnits(shape.perimeterIn / 12), room: 1 });
		if (room.transitions && room.transitions > 0) need('transition', { each: room.transitions });

		// Supplies measured in this room
		if (roomVoids.length > 0) {
			patchVoids.push(...roomVoids);
			const c = index.supplies.get('patch')?.container;
			if (c)
				result.patch = patchTakeoff({
					voids: roomVoids,
					wastePct: s.repairs.patchWastePct,
					container: c
				});
		}
		if (roomLevel.length > 0) {
			levelAreas.push(...roomLevel);
			const y = index.supplies.get('leveller')?.bagYieldCuFt;
			if (y)
				result.leveller = levellerTakeoff({
					areas: roomLevel,
					bagYieldCuFt: y,
					wastePct: s.repairs.levellerWastePct
				});
		}

		// Price the prep
		for (const p of needs) {
			const perUnit = s.schedule.prepHoursPerUnit[p.kind] ?? 0;
			const h = perUnit * (p.measures[PREP[p.kind].unit] ?? 0);
			p.measures.hour = h;
			result.prep.push({ kind: p.kind, qty: p.measures });
			const line = add(
				{
					ref: { type: 'prep', kind: p.kind },
					roomId: room.id,
					qty: 0,
					description: `${PREP[p.kind].label} — ${room.name}`,
					findingIds: p.findings.map((f) => f.id)
				},
				`priceBook.prep`,
				p.measures
			);
			addHours(p.kind, h);
			if (line) for (const f of p.findings) f.lineIds.push(line.id);
		}
		return errors.length === errorsBefore;
	}

	// Job-level materials, rounded up once per product or supply.
	for (const [productId, sqFt] of cartonNeed) {
		const p = index.floors.get(productId)!;
		const cartons = ceilUnits(sqFt / p.cartonSqFt!);
		add(
			{ ref: { type: 'floor', productId }, qty: 0, description: `${p.name} — ${cartons} cartons` },
			`priceBook.floors`,
			{
				carton: cartons,
				sqft: cartons * p.cartonSqFt!
			}
		);
	}
	for (const [productId, cutIn] of rollNeed) {
		const p = index.floors.get(productId)!;
		const lengthIn = ceilUnits(cutIn / s.roll.orderIncrementIn) * s.roll.orderIncrementIn;
		add(
			{
				ref: { type: 'floor', productId },
				qty: 0,
				description: `${p.name} — ${lengthIn / 12} lin ft of ${p.rollWidthIn! / 12} ft roll`
			},
			`priceBook.floors`,
			{
				roll_linft: lengthIn / 12,
				roll_sqyd: (lengthIn * p.rollWidthIn!) / 1296
			}
		);
	}
	if (panelSqFt > 0) {
		const u = underlaymentTakeoff({
			areaSqFt: panelSqFt,
			wastePct: s.underlayment.wastePct,
			panel: { widthIn: s.underlayment.panelWidthIn, lengthIn: s.underlayment.panelLengthIn },
			schedule: s.underlayment.schedules[s.underlayment.schedule],
			perBox: index.supplies.get('fastener')?.perBox
		});
		add(
			{
				ref: { type: 'supply', kind: 'underlayment_panel' },
				qty: 0,
				description: `Underlayment panels — ${u.panels}`
			},
			'priceBook.supplies',
			{ panel: u.panels, each: u.panels }
		);
		add(
			{
				ref: { type: 'supply', kind: 'fastener' },
				qty: 0,
				description: `Underlayment fasteners — ${u.fasteners} (${u.schedule.name})`
			},
			'priceBook.supplies',
			{ each: u.fasteners, box: u.boxes }
		);
		caution('dust_tools');
	}
	if (patchVoids.length > 0) {
		const supply = index.supplies.get('patch');
		if (supply?.container) {
			const t = patchTakeoff({
				voids: patchVoids,
				wastePct: s.repairs.patchWastePct,
				container: supply.container
			});
			add(
				{
					ref: { type: 'supply', kind: 'patch' },
					qty: 0,
					description: `${supply.name} — ${t.containers}`
				},
				'priceBook.supplies',
				{ container: t.containers, each: t.containers }
			);
		} else
			errors.push({
				path: 'priceBook.supplies',
				message: supply
					? `${supply.name}: container size is missing`
					: 'No price for supply "patch"'
			});
	}
	if (levelAreas.length > 0) {
		const supply = index.supplies.get('leveller');
		if (supply?.bagYieldCuFt) {
			const t = levellerTakeoff({
				areas: levelAreas,
				bagYieldCuFt: supply.bagYieldCuFt,
				wastePct: s.repairs.levellerWastePct
			});
			add(
				{
					ref: { type: 'supply', kind: 'leveller' },
					qty: 0,
					description: `${supply.name} — ${t.bags} bags`
				},
				'priceBook.supplies',
				{ bag: t.bags, each: t.bags }
			);
		} else
			errors.push({
				path: 'priceBook.supplies',
				message: supply ? `${supply.name}: bag yield is missing` : 'No price for supply "leveller"'
			});
	}

	const sum = totals(lines, s);
	const installerPayCents = pay.reduce((t, p) => t + p.amountCents, 0);
	const steps: WorkStep[] = [];
	for (const st of STEPS) {
		const h = st.kinds.reduce((t, k) => t + (hours.get(k) ?? 0), 0);
		if (h <= 0) continue;
		const cure = Math.max(
			0,
			...st.kinds.filter((k) => (hours.get(k) ?? 0) > 0).map((k) => s.schedule.cureHours[k] ?? 0)
		);
		steps.push({ key: st.key, label: st.label, hours: h, cureHours: cure || undefined });
	}
	return {
		ok: errors.length === 0,
		errors,
		rooms,
		findings,
		lines,
		pay,
		totals: sum,
		installerPayCents,
		margin: margin(sum.subtotalCents, installerPayCents, costCents, costComplete),
		schedule: schedule(steps, s.schedule),
		cautions: CAUTION_KINDS.filter((k) => cautions.has(k)).map((kind): CautionNote => ({
			kind,
			text: CAUTIONS[kind],
			roomIds: [...cautions.get(kind)!.roomIds],
			lineIds: [...cautions.get(kind)!.lineIds]
		})),
		warnings: [
			...warnings,
			...rooms.flatMap((r) => r.warnings.map((message) => ({ roomId: r.id, message })))
		]
	};
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
