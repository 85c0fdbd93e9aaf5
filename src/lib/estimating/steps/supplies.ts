/**
 * The install's own supplies, counted for the whole job once every room is through its steps:
 * tile setting materials (thinset, grout, backer board or membrane) and new baseboard and shoe in
 * stock lengths. Each is a price-book supply the store may leave out: without it nothing is
 * taken off, and the room's prep line (per ft² or per linear ft) prices the work as before.
 */
import type { JobMeasure, RoomResult } from '../types';
import type { PriceIndex, SupplyKind } from '../pricing';
import type { StoreSettings } from '../settings';
import {
	DEFAULT_GROUT_DEPTH_IN,
	DEFAULT_GROUT_JOINT_IN,
	groutCuInPerSqFt,
	groutUnits,
	unitsByCoverage
} from '../tile';
import { INSTALL_SUPPLY_DEFAULTS, lessDoorways, stockLengths, wallRuns } from '../trim';
import { formatLength } from '../units';
import type { CautionEvent, WorkItem } from './room';

/** A stock length as it is sold: `16 ft`, or feet and inches. */
const stockText = (inches: number) =>
	Number.isInteger(inches / 12) ? `${inches / 12} ft` : formatLength(inches, 'ft-in');

const missing = (kind: SupplyKind, name: string, what: string): WorkItem => ({
	error: { path: 'priceBook.supplies', message: `${name}: ${what} is missing (supply "${kind}")` }
});

/**
 * Thinset, grout and backer for the job's tile, and stock lengths of new baseboard and shoe. A
 * room's tile or trim counts when its prep asked for it (`tile_setting`, `tile_backer`,
 * `base_new`, `shoe_new`). Rooms are `rooms[i]` for `job.rooms[i]`.
 */
export function installSupplies(
	job: JobMeasure,
	rooms: RoomResult[],
	index: PriceIndex,
	s: StoreSettings
): { items: WorkItem[]; cautions: CautionEvent[] } {
	const items: WorkItem[] = [];
	const cautions: CautionEvent[] = [];
	const thinset = index.supplies.get('thinset');
	const grout = index.supplies.get('grout');
	const backer = index.supplies.get('backer');
	const baseboard = index.supplies.get('baseboard');
	const shoe = index.supplies.get('shoe');
	if (!thinset && !grout && !backer && !baseboard && !shoe) return { items, cautions };
	const waste = s.installSupplies?.wastePct ?? INSTALL_SUPPLY_DEFAULTS.wastePct;
	const allowance =
		s.installSupplies?.trimEndAllowanceIn ?? INSTALL_SUPPLY_DEFAULTS.trimEndAllowanceIn;

	let tileSqFt = 0;
	let groutCuIn = 0;
	let backerSqFt = 0;
	const baseRuns: number[] = [];
	const shoeRuns: number[] = [];
	rooms.forEach((r, i) => {
		if (!r.floor) return;
		const m = job.rooms[i];
		for (const p of r.prep) {
			// Only tile work reads its ft² (a room's prep measures come in many shapes).
			const sqft = p.kind === 'tile_setting' || p.kind === 'tile_backer' ? (p.qty.sqft ?? 0) : 0;
			if (p.kind === 'tile_setting' && sqft > 0) {
				tileSqFt += sqft;
				if (!grout) continue;
				const product = index.floors.get(r.floor.productId);
				const edges = product?.tileEdgesIn;
				if (!product || !edges || edges.length === 0) {
					r.warnings.push(
						`Grout is not counted for ${product?.name ?? 'this tile'}: the tile's size is not in the price book`
					);
					continue;
				}
				groutCuIn +=
					sqft *
					groutCuInPerSqFt(
						edges[0],
						edges[1] ?? edges[0],
						product.groutJointIn ?? DEFAULT_GROUT_JOINT_IN,
						product.groutDepthIn ?? DEFAULT_GROUT_DEPTH_IN
					);
			} else if (p.kind === 'tile_backer' && sqft > 0) backerSqFt += sqft;
			else if ((p.kind === 'base_new' || p.kind === 'shoe_new') && r.outline) {
				const runs = lessDoorways(
					wallRuns(r.outline.outer),
					(m?.doorways ?? []).map((d) => d.widthIn)
				);
				const to = p.kind === 'base_new' ? baseRuns : shoeRuns;
				for (const run of runs) to.push(run);
			}
		}
	});

	if (tileSqFt > 0 && thinset) {
		if (!thinset.coverageSqFt)
			items.push(missing('thinset', thinset.name, 'the coverage of a bag'));
		else {
			const n = unitsByCoverage(tileSqFt, thinset.coverageSqFt, waste);
			items.push({
				ref: { type: 'supply', kind: 'thinset' },
				qty: 0,
				description: `${thinset.name} — ${n} (${Math.round(tileSqFt)} ft² of tile at ${thinset.coverageSqFt} ft² each)`,
				path: 'priceBook.supplies',
				measures: { bag: n, each: n }
			});
		}
	}
	if (groutCuIn > 0 && grout) {
		if (!grout.bagYieldCuFt) items.push(missing('grout', grout.name, 'the yield of a bag or pail'));
		else {
			const n = groutUnits(groutCuIn, grout.bagYieldCuFt, waste);
			items.push({
				ref: { type: 'supply', kind: 'grout' },
				qty: 0,
				description: `${grout.name} — ${n} (joints come to ${Math.ceil(groutCuIn)} in³)`,
				path: 'priceBook.supplies',
				measures: { bag: n, container: n, each: n }
			});
		}
	}
	if (backerSqFt > 0 && backer) {
		if (!backer.coverageSqFt)
			items.push(missing('backer', backer.name, 'the ft² one sheet or roll covers'));
		else {
			const n = unitsByCoverage(backerSqFt, backer.coverageSqFt, waste);
			items.push({
				ref: { type: 'supply', kind: 'backer' },
				qty: 0,
				description: `${backer.name} — ${n} (${Math.round(backerSqFt)} ft² under tile)`,
				path: 'priceBook.supplies',
				measures: { panel: n, each: n }
			});
			cautions.push({ kind: 'dust_tools' });
		}
	}
	for (const [kind, supply, runs] of [
		['baseboard', baseboard, baseRuns],
		['shoe', shoe, shoeRuns]
	] as const) {
		if (!supply || runs.length === 0) continue;
		if (!supply.stockLengthIn) {
			items.push(missing(kind, supply.name, 'the stock length'));
			continue;
		}
		const t = stockLengths(runs, supply.stockLengthIn, allowance);
		if (t.pieces === 0) continue;
		items.push({
			ref: { type: 'supply', kind },
			qty: 0,
			description: `${supply.name} — ${t.pieces} lengths of ${stockText(t.stockLengthIn)} (${Math.ceil(t.runIn / 12)} lin ft of wall)`,
			path: 'priceBook.supplies',
			measures: { each: t.pieces, linft: (t.pieces * t.stockLengthIn) / 12 }
		});
	}
	return { items, cautions };
}
