import { createHmac } from 'node:crypto';
import { bypass } from 'msw';
import type Stripe from 'stripe';
import { newId, now, PREFIX } from './ids';
import { eventObject } from './objects';
import type { Delivery, Store } from './store';

export interface WebhookOptions {
	/** Where events are POSTed; null records events without delivering them. */
	url: string | null;
	/** The endpoint's signing secret (`whsec_…`). */
	secret: string;
	/** The API version events are rendered in (the SDK's pinned one). */
	apiVersion: string;
	/** How long one delivery may take before it counts as failed. */
	timeoutMs?: number;
	/** The connected account these events come from; null for the platform's own. */
	account?: string | null;
}

/** How an event is delivered: its signature's age, or a wrong signature, for tests. */
export interface DeliverOptions {
	/** Sign with a timestamp this many seconds in the past (Stripe's tolerance is 300 s). */
	lateBy?: number;
	/** Sign with a different secret, so the endpoint must refuse it. */
	badSignature?: boolean;
}

/**
 * `Stripe-Signature` as Stripe builds it: `t=<unix>,v1=<hex HMAC-SHA256 of "<t>.<raw body>">`
 * with the endpoint secret (https://docs.stripe.com/webhooks#verify-manually).
 */
export function signatureHeader(payload: string, secret: string, timestamp = now()) {
	const signature = createHmac('sha256', secret)
		.update(`${timestamp}.${payload}`, 'utf8')
		.digest('hex');
	return `t=${timestamp},v1=${signature}`;
}

/**
 * Records events in Stripe's shape and POSTs them, signed, to the app's endpoint. Automatic
 * deliveries go one at a time in the order the events happened (unless held); every attempt is
 * kept with the endpoint's status, so failed ones can be sent again.
 */
export class Webhooks {
	/** `hold` keeps new events undelivered until a test delivers them, in the order it chooses. */
	mode: 'auto' | 'hold' = 'auto';
	private queue: Promise<unknown> = Promise.resolve();
	private inFlight = new Set<Promise<unknown>>();

	constructor(
		private readonly store: Store,
		readonly options: WebhookOptions
	) {}

	/** Records an event (a snapshot of the object now) and, unless held, queues its delivery. */
	record(
		type: Stripe.Event.Type,
		object: { id: string; object: string },
		request: Stripe.Event.Request = { id: null, idempotency_key: null },
		previous?: Record<string, unknown>
	): Stripe.Event {
		const event = eventObject({
			type,
			object,
			previous,
			request,
			apiVersion: this.options.apiVersion,
			account: this.options.account
		});
		this.store.state.events[event.id] = event;
		if (this.mode === 'auto' && this.options.url) {
			this.queue = this.queue
				.then(() => this.send(event.id, 'automatic', {}))
				.catch((e) => console.error(`The Stripe fake could not deliver ${event.id}:`, e));
			this.track(this.queue);
		}
		return event;
	}

	/** Delivers events now, one after another in the order given (to test out-of-order arrival). */
	async deliver(eventIds: string[], options: DeliverOptions = {}): Promise<Delivery[]> {
		for (const id of eventIds) this.event(id);
		const kind: Delivery['kind'] = options.badSignature
			? 'bad_signature'
			: options.lateBy
				? 'late'
				: 'redelivery';
		const out: Delivery[] = [];
		const run = (async () => {
			for (const id of eventIds) out.push(await this.send(id, kind, options));
		})();
		await this.track(run);
		return out;
	}

	/** Waits until every delivery started so far has finished. */
	async settled() {
		while (this.inFlight.size) await Promise.allSettled([...this.inFlight]);
	}

	deliveries(filter: { event?: string; type?: string } = {}): Delivery[] {
		return this.store.state.deliveries
			.filter(
				(d) =>
					(!filter.event || d.event === filter.event) && (!filter.type || d.type === filter.type)
			)
			.slice()
			.reverse();
	}

	event(id: string): Stripe.Event {
		const event = this.store.state.events[id];
		if (!event) throw new Error(`No such event: '${id}'`);
		return event;
	}

	private track<T>(promise: Promise<T>): Promise<T> {
		this.inFlight.add(promise);
		const done = () => this.inFlight.delete(promise);
		promise.then(done, done);
		return promise;
	}

	private async send(
		eventId: string,
		kind: Delivery['kind'],
		options: DeliverOptions
	): Promise<Delivery> {
		const event = this.event(eventId);
		const url = this.options.url;
		const at = now();
		const signedAt = at - (options.lateBy ?? 0);
		const delivery: Delivery = {
			id: newId(PREFIX.delivery),
			event: event.id,
			type: event.type,
			url: url ?? '',
			at,
			signedAt,
			kind,
			status: null,
			ok: false,
			error: null,
			response: ''
		};
		if (!url) {
			delivery.error = 'No webhook endpoint is set';
		} else {
			// Stripe sends the event pretty-printed: an endpoint that re-serializes the JSON before
			// checking the signature fails here as it would with Stripe.
			const payload = JSON.stringify(event, null, 2);
			const secret = options.badSignature ? `${this.options.secret}_wrong` : this.options.secret;
			try {
				// bypass(): the delivery is a real HTTP request to the app, never answered by msw.
				const response = await fetch(
					bypass(url, {
						method: 'POST',
						headers: {
							'content-type': 'application/json; charset=utf-8',
							'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
							'stripe-signature': signatureHeader(payload, secret, signedAt)
						},
						body: payload,
						signal: AbortSignal.timeout(this.options.timeoutMs ?? 10_000)
					})
				);
				delivery.status = response.status;
				delivery.ok = response.status >= 200 && response.status < 300;
				delivery.response = (await response.text()).slice(0, 500);
			} catch (e) {
				delivery.error = (e as Error).message;
			}
		}
		const deliveries = this.store.state.deliveries;
		deliveries.push(delivery);
		if (deliveries.length > 2000) deliveries.splice(0, deliveries.length - 2000);
		if (delivery.ok && kind !== 'bad_signature') event.pending_webhooks = 0;
		this.store.save();
		return delivery;
	}
}
