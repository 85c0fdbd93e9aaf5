// Typed factories for integration tests: real rows through the real auth and query modules.
import { createAuth } from '$lib/server/create-auth';
import { db } from '$lib/server/db';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import * as payments from '$lib/server/db/queries/payments';
import { inStore, type StoreWriteTx } from '$lib/server/db/tenant';
import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import * as sites from '$lib/server/db/queries/sites';
import * as activity from '$lib/server/db/queries/stripe-activity';
import { recordInStore } from '$lib/server/payments/record';
import { refundInStore } from '$lib/server/payments/refunds';
import { acceptQuote } from '$lib/server/quotes/answer';
import { buildQuote } from '$lib/server/quotes/build';
import { sendQuote } from '$lib/server/quotes/send';
import { defaultSettings } from '$lib/estimating';
import { samplePriceBook } from '$lib/estimating/sample';
import { emptyRoom } from '$lib/measure/draft';
import type { Mail } from '$lib/server/mail/templates';
import { grantsOf, type Role } from '$lib/server/permissions';
import type { RequestEvent } from '@sveltejs/kit';

export const TEST_PASSWORD = 'test-password-1';
export const TEST_ORIGIN = 'http://127.0.0.1:4173';

/** Every e-mail the test auth sent, newest last. */
export const sentMail: Mail[] = [];

export const auth = createAuth({
	db,
	baseURL: TEST_ORIGIN,
	secret: 'integration-tests-secret-integration-tests',
	sendMail: async (mail) => {
		sentMail.push(mail);
		return { id: String(sentMail.length) };
	}
});

let counter = 0;
/** A name no other test run or file will have. */
export function unique(prefix: string) {
	counter += 1;
	return `${prefix}-${Date.now().toString(36)}-${counter}-${Math.random().toString(36).slice(2, 6)}`;
}

export async function makeUser(name = 'Test Person') {
	const email = `${unique('person')}@test.example`;
	const { user } = await auth.api.signUpEmail({ body: { name, email, password: TEST_PASSWORD } });
	return user;
}

/** Request headers carrying a session of the user, for auth calls that need one. */
export async function sessionOf(email: string, password = TEST_PASSWORD) {
	const { headers } = await auth.api.signInEmail({
		body: { email, password },
		returnHeaders: true
	});
	const cookie = (headers.getSetCookie?.() ?? [headers.get('set-cookie') ?? ''])
		.map((c) => c.split(';')[0])
		.join('; ');
	return new Headers({ cookie, origin: TEST_ORIGIN });
}

export interface TestStore {
	id: string;
	name: string;
	owner: Awaited<ReturnType<typeof makeUser>>;
}

export async function makeStore(name = 'Test Floors'): Promise<TestStore> {
	const owner = await makeUser(`${name} owner`);
	const org = await auth.api.createOrganization({
		body: { name, slug: unique('store'), userId: owner.id }
	});
	if (!org) throw new Error('store not created');
	return { id: org.id, name, owner };
}

export async function addMember(storeId: string, role: Role, name = `A ${role}`) {
	const user = await makeUser(name);
	await auth.api.addMember({ body: { userId: user.id, role, organizationId: storeId } });
	return user;
}

export async function makeCustomer(storeId: string, name = 'Test Customer') {
	return inStore(storeId, (tx) =>
		customers.create(tx, { name, email: null, phone: null, notes: '' })
	);
}

export async function makeJob(storeId: string, actorId: string, customerId?: string) {
	const customerRow = customerId ?? (await makeCustomer(storeId)).id;
	const job = await inStore(storeId, (tx) =>
		jobs.create(tx, { customerId: customerRow, title: unique('job') }, actorId)
	);
	if (!job) throw new Error('job not created');
	return job;
}

/** The store's settings (engine defaults, a sales tax and a deposit rule) and the sample price book. */
export async function makePriceBook(storeId: string) {
	return inStore(storeId, async (tx) => {
		const existing = await priceBook.list(tx, 'floor');
		if (existing.length) {
			const byName = new Map(existing.map((row) => [row.name, row.id]));
			return {
				floors: Object.fromEntries(samplePriceBook.floors.map((f) => [f.id, byName.get(f.name)!]))
			};
		}
		return seedPriceBook(tx);
	});
}

async function seedPriceBook(tx: StoreWriteTx) {
	await tradeSettings.save(tx, {
		settings: {
			...defaultSettings,
			taxes: [{ name: 'Test sales tax', rateBps: 650, groups: ['material'] }],
			deposit: { percentBps: 3000, minimumCents: 25_000 }
		},
		currency: 'USD',
		quoteValidDays: 30
	});
	const floors: Record<string, string> = {};
	for (const { id: sampleId, name, ...data } of samplePriceBook.floors) {
		const row = await priceBook.create(tx, { section: 'floor', code: '', name, data });
		floors[sampleId] = row.id;
	}
	for (const item of samplePriceBook.prep) {
		await priceBook.create(tx, {
			section: 'prep',
			code: item.kind,
			name: item.kind,
			data: item
		});
	}
	for (const item of samplePriceBook.removal) {
		await priceBook.create(tx, {
			section: 'removal',
			code: item.existing,
			name: item.existing,
			data: item
		});
	}
	for (const item of samplePriceBook.supplies) {
		await priceBook.create(tx, {
			section: 'supply',
			code: item.kind,
			name: item.name,
			data: item
		});
	}
	return { floors };
}

export async function makeSite(storeId: string, customerId: string) {
	const row = await inStore(storeId, (tx) =>
		sites.create(tx, customerId, {
			label: 'Home',
			address: '9 Test Lane',
			town: 'Testville',
			postcode: '',
			builtYear: 1962,
			subfloor: 'plywood',
			notes: ''
		})
	);
	if (!row) throw new Error('site not created');
	return row;
}

/** A measured room in feet and inches, with the floor given by its price-book id. */
export function roomDraft(
	id: string,
	name: string,
	productId: string,
	width = "12'",
	length = "10'"
) {
	return {
		...emptyRoom(id, name),
		shape: { kind: 'rect' as const, width, length },
		floor: { productId, layout: 'straight' as const }
	};
}

/** A job with a one-room measure, a price book and a built draft quote. */
export async function makeQuotedJob(store: TestStore) {
	const { floors } = await makePriceBook(store.id);
	const customerRow = await makeCustomer(store.id);
	const site = await makeSite(store.id, customerRow.id);
	const jobRow = await makeJob(store.id, store.owner.id, customerRow.id);
	const draft = { builtYear: '1962', rooms: [roomDraft('r1', 'Kitchen', floors['lvp-grey'])] };
	const built = await inStore(store.id, async (tx) => {
		await sites.setJobSite(tx, jobRow.id, site.id);
		const saved = await measures.save(tx, jobRow.id, draft, 0, store.owner.id);
		if (!saved.ok) throw new Error('measure not saved');
		return buildQuote(tx, jobRow.id, store.owner.id);
	});
	if (!built.ok) throw new Error(`quote not built: ${JSON.stringify(built)}`);
	return { job: jobRow, customer: customerRow, site, floors, draft, quote: built.quote };
}

/** A quoted job the customer accepted, with a cash deposit, a partial refund and a Stripe event. */
export async function makePaidJob(store: TestStore) {
	const made = await makeQuotedJob(store);
	await sendAndAccept(store, made);
	return inStore(store.id, async (tx) => {
		const paid = await recordInStore(
			tx,
			made.job.id,
			{
				purpose: 'deposit',
				method: 'cash',
				amountCents: made.quote.depositCents,
				reference: 'Receipt 1'
			},
			store.owner.id
		);
		if (!paid.ok) throw new Error(`deposit not recorded: ${paid.reason}`);
		const refunded = await refundInStore(
			tx,
			paid.payment.id,
			{ amountCents: 100, reason: 'overcharge', note: 'Rounded down' },
			store.owner.id
		);
		if (!refunded.ok) throw new Error(`refund not recorded: ${refunded.reason}`);
		await payments.firstSight(tx, {
			id: unique('evt'),
			type: 'charge.succeeded',
			objectId: null,
			created: 1_800_000_000
		});
		await seedStripeActivity(tx);
		return { ...made, payment: paid.payment, refund: refunded.refund };
	});
}

/** A charge, a refund and a payout in the store's copy of its Stripe activity, and its sync. */
async function seedStripeActivity(tx: StoreWriteTx) {
	const at = new Date('2027-01-15T12:00:00Z');
	const charge = unique('ch').replace(/[^a-z0-9]/gi, '');
	await activity.saveCharges(tx, [
		{
			id: charge,
			paymentIntentId: null,
			status: 'succeeded',
			currency: 'USD',
			amountCents: 10_000,
			feeCents: 320,
			paymentId: null,
			jobId: null,
			stripeCreated: at
		}
	]);
	await activity.saveRefunds(tx, [
		{
			id: unique('re').replace(/[^a-z0-9]/gi, ''),
			chargeId: charge,
			paymentIntentId: null,
			status: 'succeeded',
			currency: 'USD',
			amountCents: 1_000,
			stripeCreated: at
		}
	]);
	await activity.savePayouts(tx, [
		{
			id: unique('po').replace(/[^a-z0-9]/gi, ''),
			status: 'paid',
			currency: 'USD',
			amountCents: 8_680,
			grossCents: 10_000,
			feeCents: 320,
			refundCents: 1_000,
			transactions: 2,
			arrivalDate: at,
			stripeCreated: at
		}
	]);
	await activity.noteSync(tx, at);
}

/** Sends a made quote to the customer, who accepts it: the job is ready for its deposit. */
export async function sendAndAccept(
	store: TestStore,
	made: { job: { id: string }; quote: { id: string } },
	to = 'c@test.example'
) {
	await inStore(store.id, async (tx) => {
		const sent = await sendQuote(tx, made.quote.id, {
			to,
			validDays: 30,
			actorId: store.owner.id
		});
		if (!sent.ok) throw new Error(`quote not sent: ${sent.reason}`);
		const accepted = await acceptQuote(tx, made.job.id, made.quote.id, {
			name: 'A Customer',
			ip: null,
			userAgent: null
		});
		if (!accepted.ok) throw new Error(`quote not accepted: ${accepted.reason}`);
	});
}

/** A member of a store as the hooks put them in `locals`. */
export interface Member {
	user: Awaited<ReturnType<typeof makeUser>>;
	role: Role;
	store: TestStore;
}

/**
 * A request event for a route handler or action, as SvelteKit makes it after the hooks: the
 * member's user, session, store and role in `locals`. Tests hand it to the handler and to their
 * mock of `getRequestEvent`.
 */
export function memberEvent(
	who: Member,
	path: string,
	params: Record<string, string>,
	init?: RequestInit
): RequestEvent {
	const url = new URL(`${TEST_ORIGIN}${path}`);
	return {
		url,
		request: new Request(url, init),
		params,
		locals: {
			user: who.user as App.Locals['user'],
			session: { id: `session-${who.user.id}` } as App.Locals['session'],
			store: { id: who.store.id, name: who.store.name, slug: 'test', logo: null, timeZone: 'UTC' },
			role: who.role,
			grants: grantsOf(who.role),
			denied: null
		}
	} as unknown as RequestEvent;
}
