import { http, HttpResponse } from 'msw';
import type Stripe from 'stripe';
import { invalid, StripeFakeError } from './errors';
import { canonical, parseParams, Reader, type Params } from './form';
import { newId, now, PREFIX } from './ids';
import { asList, expand, expansions, paginate, rangeFilter, type Expander } from './list';
import type { Payments } from './payments';
import type { Store } from './store';

const BASE = 'https://api.stripe.com';
const DAY = 24 * 3600;

interface Context {
	reader: Reader;
	/** The path's captured ids. */
	ids: string[];
	/** What events caused by this request carry as `request`. */
	request: Stripe.Event.Request;
}

interface Route {
	method: 'GET' | 'POST';
	pattern: RegExp;
	run: (ctx: Context) => unknown;
}

const idOf = (value: string | { id: string } | null | undefined) =>
	typeof value === 'string' ? value : (value?.id ?? null);

/** A filter on an id field: absent → keeps all. */
function idFilter<T>(reader: Reader, key: string, pick: (item: T) => string | null) {
	const wanted = reader.string(key);
	return (item: T) => !wanted || pick(item) === wanted;
}

function all<T>(...tests: ((item: T) => boolean)[]) {
	return (item: T) => tests.every((test) => test(item));
}

function created<T extends { created: number }>(reader: Reader, key = 'created') {
	const test = rangeFilter(reader, key);
	return (item: T) => !test || test(item.created);
}

const LIST = ['limit', 'starting_after', 'ending_before', 'expand'];

/** The fake's API routes: the endpoints Flushline's payments use, in Stripe's shapes. */
function routes(store: Store, payments: Payments): Route[] {
	const s = () => store.state;
	const route = (method: Route['method'], path: string, run: Route['run']): Route => ({
		method,
		pattern: new RegExp(`^${path.replace(/:id/g, '([^/]+)')}$`),
		run
	});
	const retrieve = (collection: Parameters<Store['get']>[0]) => (ctx: Context) => {
		ctx.reader.only('expand');
		return store.get(collection, ctx.ids[0]);
	};
	return [
		route('POST', '/v1/customers', (c) => payments.createCustomer(c.reader, c.request)),
		route('GET', '/v1/customers', ({ reader }) => {
			reader.only(...LIST, 'email', 'created');
			const email = reader.string('email');
			return paginate(
				store.newestFirst('customers'),
				reader,
				'/v1/customers',
				all(created(reader), (c) => !email || c.email === email),
				'customer'
			);
		}),
		route('GET', '/v1/customers/:id', retrieve('customers')),
		route('POST', '/v1/customers/:id', (c) =>
			payments.updateCustomer(c.ids[0], c.reader, c.request)
		),

		route('POST', '/v1/checkout/sessions', (c) => payments.createSession(c.reader)),
		route('GET', '/v1/checkout/sessions', ({ reader }) => {
			reader.only(...LIST, 'payment_intent', 'customer', 'status', 'created');
			const status = reader.oneOf('status', ['open', 'complete', 'expired'] as const);
			return paginate(
				store.newestFirst('checkoutSessions'),
				reader,
				'/v1/checkout/sessions',
				all(
					created(reader),
					idFilter(reader, 'payment_intent', (x: Stripe.Checkout.Session) =>
						idOf(x.payment_intent)
					),
					idFilter(reader, 'customer', (x: Stripe.Checkout.Session) => idOf(x.customer)),
					(x) => !status || x.status === status
				),
				'checkout.session'
			);
		}),
		route('GET', '/v1/checkout/sessions/:id', retrieve('checkoutSessions')),
		route('GET', '/v1/checkout/sessions/:id/line_items', ({ reader, ids }) => {
			reader.only(...LIST);
			store.get('checkoutSessions', ids[0]);
			return paginate(
				s().lineItems[ids[0]] ?? [],
				reader,
				`/v1/checkout/sessions/${ids[0]}/line_items`,
				() => true,
				'line item'
			);
		}),
		route('POST', '/v1/checkout/sessions/:id/expire', (c) => {
			c.reader.only('expand');
			return payments.expireSession(c.ids[0], c.request);
		}),

		route('POST', '/v1/payment_intents', (c) => payments.createPaymentIntent(c.reader, c.request)),
		route('GET', '/v1/payment_intents', ({ reader }) => {
			reader.only(...LIST, 'customer', 'created');
			return paginate(
				store.newestFirst('paymentIntents'),
				reader,
				'/v1/payment_intents',
				all(
					created(reader),
					idFilter(reader, 'customer', (x: Stripe.PaymentIntent) => idOf(x.customer))
				),
				'payment_intent'
			);
		}),
		route('GET', '/v1/payment_intents/:id', retrieve('paymentIntents')),
		route('POST', '/v1/payment_intents/:id/confirm', (c) =>
			payments.confirmPaymentIntent(c.ids[0], c.reader, c.request)
		),

		route('GET', '/v1/charges', ({ reader }) => {
			reader.only(...LIST, 'customer', 'payment_intent', 'created');
			return paginate(
				store.newestFirst('charges'),
				reader,
				'/v1/charges',
				all(
					created(reader),
					idFilter(reader, 'customer', (x: Stripe.Charge) => idOf(x.customer)),
					idFilter(reader, 'payment_intent', (x: Stripe.Charge) => idOf(x.payment_intent))
				),
				'charge'
			);
		}),
		route('GET', '/v1/charges/:id', retrieve('charges')),

		route('POST', '/v1/refunds', (c) => payments.createRefund(c.reader, c.request)),
		route('GET', '/v1/refunds', ({ reader }) => {
			reader.only(...LIST, 'charge', 'payment_intent', 'created');
			return paginate(
				store.newestFirst('refunds'),
				reader,
				'/v1/refunds',
				all(
					created(reader),
					idFilter(reader, 'charge', (x: Stripe.Refund) => idOf(x.charge)),
					idFilter(reader, 'payment_intent', (x: Stripe.Refund) => idOf(x.payment_intent))
				),
				'refund'
			);
		}),
		route('GET', '/v1/refunds/:id', retrieve('refunds')),
		route('POST', '/v1/refunds/:id', (c) => payments.updateRefund(c.ids[0], c.reader, c.request)),

		route('GET', '/v1/balance', ({ reader }) => {
			reader.only('expand');
			return payments.balance();
		}),
		route('GET', '/v1/balance_transactions', ({ reader }) => {
			reader.only(...LIST, 'payout', 'type', 'created', 'currency', 'source');
			const payout = reader.string('payout');
			if (payout) store.get('payouts', payout);
			const type = reader.string('type');
			const currency = reader.string('currency')?.toLowerCase();
			return paginate(
				store.newestFirst('balanceTransactions'),
				reader,
				'/v1/balance_transactions',
				all(
					created(reader),
					(x) => !payout || s().paidOutBy[x.id] === payout,
					(x) => !type || x.type === type,
					(x) => !currency || x.currency === currency,
					idFilter(reader, 'source', (x: Stripe.BalanceTransaction) => idOf(x.source))
				),
				'balance transaction'
			);
		}),
		route('GET', '/v1/balance_transactions/:id', retrieve('balanceTransactions')),

		route('GET', '/v1/payouts', ({ reader }) => {
			reader.only(...LIST, 'status', 'created', 'arrival_date');
			const status = reader.string('status');
			const arrival = rangeFilter(reader, 'arrival_date');
			return paginate(
				store.newestFirst('payouts'),
				reader,
				'/v1/payouts',
				all(
					created(reader),
					(x) => !status || x.status === status,
					(x) => !arrival || arrival(x.arrival_date)
				),
				'payout'
			);
		}),
		route('GET', '/v1/payouts/:id', retrieve('payouts')),

		route('GET', '/v1/events', ({ reader }) => {
			reader.only(...LIST, 'type', 'types', 'created', 'delivery_success');
			const type = reader.string('type');
			const types = reader.strings('types');
			const matches = (t: string) =>
				(!type || (type.endsWith('.*') ? t.startsWith(type.slice(0, -1)) : t === type)) &&
				(!types.length || types.includes(t));
			return paginate(
				store.newestFirst('events'),
				reader,
				'/v1/events',
				all(created(reader), (x) => matches(x.type)),
				'event'
			);
		}),
		route('GET', '/v1/events/:id', retrieve('events'))
	];
}

/** Expansions that are not ids: a session's `line_items`, a charge's `refunds`. */
function extraExpansions(store: Store): Expander {
	return (node, field) => {
		if (node.object === 'checkout.session' && field === 'line_items') {
			const id = String(node.id);
			return asList(
				structuredClone(store.state.lineItems[id] ?? []),
				`/v1/checkout/sessions/${id}/line_items`
			);
		}
		if (node.object === 'charge' && field === 'refunds') {
			const refunds = store.newestFirst('refunds').filter((r) => idOf(r.charge) === node.id);
			return asList(structuredClone(refunds), `/v1/refunds?charge=${String(node.id)}`);
		}
		return undefined;
	};
}

function authenticate(header: string | null) {
	const key = header?.match(/^Bearer (\S+)$/)?.[1];
	if (!key) {
		throw new StripeFakeError(401, {
			type: 'invalid_request_error',
			message:
				"You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY')."
		});
	}
	if (!/^(sk|rk)_test_/.test(key)) {
		throw new StripeFakeError(401, {
			type: 'invalid_request_error',
			message: `Invalid API Key provided: ${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)} (the local Stripe fake takes test keys, sk_test_…)`
		});
	}
}

/** Stripe's 401 for a request without a test key, or null when its key is one. */
function refusedKey(request: Request) {
	try {
		authenticate(request.headers.get('authorization'));
		return null;
	} catch (e) {
		if (e instanceof StripeFakeError) return HttpResponse.json(e.toJSON(), { status: e.status });
		throw e;
	}
}

/** Whether Stripe keeps a response for its idempotency key: not for refused parameters or auth. */
const keepsResult = (status: number) => status < 400 || status === 402 || status >= 500;

/**
 * The msw handlers answering everything under https://api.stripe.com. Unknown paths get
 * Stripe's "Unrecognized request URL" 404, so nothing reaches the real Stripe while the fake is on.
 */
export function stripeHandlers(
	accountFor: (id: string | null) => { store: Store; payments: Payments },
	apiVersion: string,
	connected: { has: (id: string) => boolean; create: () => string } = {
		has: () => false,
		create: () => newId('acct_')
	}
) {
	const noAccess = (id: string) =>
		HttpResponse.json(
			{
				error: {
					type: 'invalid_request_error',
					message: `The provided key does not have access to account '${id}' (or that account does not exist).`
				}
			},
			{ status: 403 }
		);
	const account = (id: string) => ({
		id,
		object: 'account',
		type: 'standard',
		charges_enabled: true,
		payouts_enabled: true,
		details_submitted: true,
		livemode: false
	});
	return [
		// Connected accounts, asked for with the platform's key: one the fake has is answered, any
		// other is refused as Stripe refuses an account not connected to the platform.
		http.get(`${BASE}/v1/accounts/:id`, ({ request, params }) => {
			const refused = refusedKey(request);
			if (refused) return refused;
			const id = String(params.id);
			if (request.headers.get('stripe-account') !== null) return noAccess(id);
			return connected.has(id) ? HttpResponse.json(account(id)) : noAccess(id);
		}),
		http.post(`${BASE}/v1/accounts`, ({ request }) => {
			const refused = refusedKey(request);
			if (refused) return refused;
			return HttpResponse.json(account(connected.create()));
		}),
		http.all(`${BASE}/*`, async ({ request }) => {
			const header = request.headers.get('stripe-account');
			if (header !== null && !/^acct_[A-Za-z0-9]{6,}$/.test(header)) {
				return HttpResponse.json(
					{
						error: {
							type: 'invalid_request_error',
							message: `The provided key does not have access to account '${header}' (or that account does not exist).`
						}
					},
					{ status: 403 }
				);
			}
			const { store, payments } = accountFor(header);
			return answer(store, payments, apiVersion, request);
		})
	];
}

const tables = new WeakMap<Store, { table: Route[]; extra: Expander }>();

/** One request to one account's objects. */
async function answer(store: Store, payments: Payments, apiVersion: string, request: Request) {
	let cached = tables.get(store);
	if (!cached) {
		cached = { table: routes(store, payments), extra: extraExpansions(store) };
		tables.set(store, cached);
	}
	const { table, extra } = cached;
	{
		{
			const url = new URL(request.url);
			const method = request.method.toUpperCase();
			const headers: Record<string, string> = {
				'content-type': 'application/json',
				'request-id': newId(PREFIX.request),
				'stripe-version': request.headers.get('stripe-version') ?? apiVersion
			};
			const key = method === 'POST' ? request.headers.get('idempotency-key') : null;
			if (key) headers['idempotency-key'] = key;
			const respond = (status: number, body: unknown) =>
				new HttpResponse(JSON.stringify(body, null, 2), { status, headers });
			const body = method === 'POST' ? await request.text() : '';
			let keep: ((status: number, text: string) => void) | null = null;
			try {
				authenticate(request.headers.get('authorization'));
				const params: Params = parseParams(
					method === 'POST' ? new URLSearchParams(body) : url.searchParams
				);
				let ids: string[] = [];
				const found = table.find((r) => {
					const m = r.method === method && r.pattern.exec(url.pathname);
					if (m) ids = m.slice(1).map(decodeURIComponent);
					return Boolean(m);
				});
				if (!found) {
					throw new StripeFakeError(404, {
						type: 'invalid_request_error',
						message: `Unrecognized request URL (${method}: ${url.pathname}). The local Stripe fake answers the endpoints listed in README, "The local fakes".`
					});
				}
				if (key) {
					if (key.length > 255)
						throw invalid('Idempotency keys can be up to 255 characters long.', undefined);
					const replay = idempotent(store, key, method, url.pathname, params);
					if (replay) {
						headers['idempotent-replayed'] = 'true';
						return new HttpResponse(replay.body, { status: replay.status, headers });
					}
					keep = (status, text) => {
						if (!keepsResult(status)) return;
						store.state.idempotency[key] = {
							method,
							path: url.pathname,
							params: canonical(params),
							status,
							body: text,
							created: now()
						};
					};
				}
				const swept = payments.sweepExpired();
				const result = found.run({
					reader: new Reader(params),
					ids,
					request: { id: headers['request-id'], idempotency_key: key }
				});
				const text = JSON.stringify(expand(result, expansions(params), store, extra), null, 2);
				keep?.(200, text);
				if (method === 'POST' || swept) store.save();
				return new HttpResponse(text, { status: 200, headers });
			} catch (e) {
				let error: StripeFakeError;
				if (e instanceof StripeFakeError) error = e;
				else {
					console.error('The local Stripe fake failed on', method, url.pathname, e);
					error = new StripeFakeError(500, {
						type: 'api_error',
						message: 'An unexpected error occurred in the local Stripe fake.'
					});
				}
				const text = JSON.stringify(error.toJSON(), null, 2);
				keep?.(error.status, text);
				if (method === 'POST') store.save();
				return respond(error.status, error.toJSON());
			}
		}
	}
}

/**
 * Stripe's idempotency: a key seen in the last 24 hours replays its first response when the
 * request is the same, and is refused when it names another endpoint or other parameters.
 */
function idempotent(store: Store, key: string, method: string, path: string, params: Params) {
	const entries = store.state.idempotency;
	const cutoff = now() - DAY;
	for (const [k, entry] of Object.entries(entries)) if (entry.created < cutoff) delete entries[k];
	const entry = entries[key];
	if (!entry) return null;
	if (entry.method !== method || entry.path !== path) {
		throw new StripeFakeError(400, {
			type: 'idempotency_error',
			message: `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${entry.method} ${entry.path}' vs '${method} ${path}'). Try using a key other than '${key}' if you meant to execute a different request.`
		});
	}
	if (entry.params !== canonical(params)) {
		throw new StripeFakeError(400, {
			type: 'idempotency_error',
			message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`
		});
	}
	return entry;
}
