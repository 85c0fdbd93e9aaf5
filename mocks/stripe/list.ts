import { isSafeKey } from '../../src/lib/input/fields';
import { invalid, missingParam } from './errors';
import type { Params } from './form';
import { Reader } from './form';
import type { Store } from './store';

export interface ApiList<T> {
	object: 'list';
	data: T[];
	has_more: boolean;
	url: string;
}

/** A list answer in Stripe's shape. */
export function asList<T>(data: T[], url: string, hasMore = false): ApiList<T> {
	return { object: 'list', data, has_more: hasMore, url };
}

/**
 * `created`-style range filters: `created=<unix>` or `created[gt|gte|lt|lte]=<unix>`.
 * Returns a test for a timestamp, or null when the filter is absent.
 */
export function rangeFilter(reader: Reader, key: string): ((value: number) => boolean) | null {
	if (!reader.has(key)) return null;
	const raw = reader.params[key];
	if (typeof raw === 'string') {
		const exact = reader.integer(key)!;
		return (v) => v === exact;
	}
	const range = reader.object(key)!.only('gt', 'gte', 'lt', 'lte');
	const gt = range.integer('gt');
	const gte = range.integer('gte');
	const lt = range.integer('lt');
	const lte = range.integer('lte');
	return (v) =>
		(gt === undefined || v > gt) &&
		(gte === undefined || v >= gte) &&
		(lt === undefined || v < lt) &&
		(lte === undefined || v <= lte);
}

/**
 * One page of a list, as Stripe pages: newest first, `limit` 1–100 (10 by default), and a cursor:
 * `starting_after` gives the objects after that id, `ending_before` the ones just before it. The
 * cursor object must exist; `has_more` says whether more lie beyond the page in that direction.
 */
export function paginate<T extends { id: string }>(
	all: T[],
	reader: Reader,
	url: string,
	keep: (item: T) => boolean,
	kind: string
): ApiList<T> {
	const limit = reader.integer('limit') ?? 10;
	if (limit < 1 || limit > 100) {
		throw invalid('This value must be between 1 and 100.', 'limit', 'parameter_invalid_integer');
	}
	const after = reader.string('starting_after');
	const before = reader.string('ending_before');
	if (after && before) {
		throw invalid(
			'You may only specify one of these parameters: ending_before, starting_after.',
			'starting_after'
		);
	}
	const position = (id: string, param: string) => {
		const index = all.findIndex((item) => item.id === id);
		if (index < 0) throw missingParam(kind, id, param);
		return index;
	};
	if (before) {
		const kept = all.slice(0, position(before, 'ending_before')).filter(keep);
		return asList(kept.slice(-limit), url, kept.length > limit);
	}
	const start = after ? position(after, 'starting_after') + 1 : 0;
	const kept = all.slice(start).filter(keep);
	return asList(kept.slice(0, limit), url, kept.length > limit);
}

/** Extra expansions that are not ids: a session's line items, a charge's refunds. */
export type Expander = (object: Record<string, unknown>, field: string) => unknown | undefined;

/**
 * Applies `expand[]` paths (`payment_intent.latest_charge.balance_transaction`, or `data.…` on a
 * list) to a copy of a response, replacing ids with their objects, up to Stripe's four levels.
 */
export function expand<T>(value: T, paths: string[], store: Store, extra: Expander): T {
	if (!paths.length) return value;
	const copy = structuredClone(value) as Record<string, unknown>;
	for (const path of paths) {
		const parts = path.split('.');
		if (parts.length > 4) {
			throw invalid(
				`You cannot expand more than 4 levels of a property. Property: ${path}`,
				'expand'
			);
		}
		expandPath(copy, parts, path, store, extra);
	}
	return copy as T;
}

function expandPath(
	node: Record<string, unknown>,
	parts: string[],
	whole: string,
	store: Store,
	extra: Expander
) {
	const [field, ...rest] = parts;
	if (node.object === 'list' && field === 'data' && Array.isArray(node.data)) {
		if (!rest.length) throw notExpandable(whole);
		for (const item of node.data as Record<string, unknown>[])
			expandPath(item, rest, whole, store, extra);
		return;
	}
	if (!isSafeKey(field)) throw notExpandable(whole);
	let value = Object.hasOwn(node, field) ? node[field] : undefined;
	if (typeof value === 'string') {
		const found = store.find(value);
		if (!found) throw notExpandable(whole);
		value = structuredClone(found);
		node[field] = value;
	} else if (value === undefined) {
		const built = extra(node, field);
		if (built === undefined) throw notExpandable(whole);
		value = built;
		node[field] = value;
	}
	if (value === null) {
		if (!NULLABLE_EXPANDABLE.has(field)) throw notExpandable(whole);
		return;
	}
	if (typeof value !== 'object' || !('object' in (value as object))) throw notExpandable(whole);
	if (!rest.length) return;
	expandPath(value as Record<string, unknown>, rest, whole, store, extra);
}

/** Expandable fields that may be null (an unpaid session's `payment_intent`…): Stripe leaves them null. */
const NULLABLE_EXPANDABLE = new Set([
	'customer',
	'payment_intent',
	'latest_charge',
	'balance_transaction',
	'charge',
	'source',
	'payment_method',
	'invoice',
	'subscription',
	'setup_intent',
	'payment_link',
	'failure_balance_transaction',
	'original_payout',
	'reversed_by',
	'destination',
	'default_source',
	'review',
	'on_behalf_of',
	'application',
	'application_fee'
]);

function notExpandable(path: string) {
	return invalid(`This property cannot be expanded (${path}).`, 'expand');
}

/** The `expand[]` paths of a request. */
export function expansions(params: Params): string[] {
	return new Reader(params).strings('expand');
}
