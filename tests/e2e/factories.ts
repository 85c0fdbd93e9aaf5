// Typed factories for the browser tests: each test makes the rows it needs, in a store of its own
// when it writes, so that it passes alone, in any order and beside other workers.
//
//   const store = await makeStore({ people: ['sales', 'installer'], priceBook: true });
//   const greta = await demoCustomer(store, 'Greta Oakhurst', { email: freshEmail('greta') });
//   const job = await makeJob(store, { customer: greta, title: 'Porch' });   // a draft job
//   const oak = await demoJob(store, 'Living room oak');     // the demo's job, walked as seeded
//   await signInAs(context, store.people[1]);                 // from ./fixtures: no sign-in form
//   const link = customerLink(store, oak);                    // the customer's signed link
//   await payByCard(request, link);                           // the deposit, on the Stripe fake
//
// Stores, logins and members are made through better-auth's API (support/auth.ts); customers,
// sites, jobs and their walk through the app's query modules, all in support/queries.ts; money
// through the customer's page and the Stripe fake's checkout over HTTP, as a customer pays.
// Names are invented (an invented store in an invented town), never real people or firms.
import { expect, type APIRequestContext } from '@playwright/test';
import { randomBytes } from 'node:crypto';
import { CUSTOMERS, JOBS, SITES } from '../../scripts/seed';
import { JOB_STATUSES, type JobStatus } from '../../src/lib/jobs/status';
import { signLink } from '../../src/lib/server/customer-link';
import type { Role } from '../../src/lib/server/permissions';
import { freshEmail } from './helpers';
import { auth, ORIGIN, type Login } from './support/auth';
import * as q from './support/queries';

/** Every login a factory makes has this password. */
export const TEST_PASSWORD = 'e2e-password-1';

/** A login and the role it was made for in its store. */
export interface Person extends Login {
	id: string;
	name: string;
	role: Role;
}

export interface TestStore {
	id: string;
	name: string;
	/** The owner first, then the other people in the order asked for. */
	people: Person[];
	/** The store's own connected account in the Stripe fake (`stripe: true`), else null. */
	stripeAccount: string | null;
	/** A floor of the store's price book by its name (`priceBook: true`). */
	floor: (name: string) => string;
}

export interface StoreOptions {
	/** The store's name; a unique one by default. Names may repeat, slugs never do. */
	name?: string;
	/** The owner's name. */
	owner?: string;
	/** People besides the owner: a role, or a role with a name or an existing login. */
	people?: (Role | { role: Role; name?: string; login?: Person })[];
	/** The demo's trade settings (a 6.5 % sales tax, a 30 % deposit) and price book. */
	priceBook?: boolean;
	/** A connected Stripe account of its own, so its payments and payouts are its alone. */
	stripe?: boolean;
}

/** A short unique suffix: the time and a random part, safe across workers and runs. */
export function unique(prefix: string) {
	return `${prefix}-${Date.now().toString(36)}${randomBytes(3).toString('hex')}`;
}

/** A new login (not yet in any store). */
export async function makeLogin(name = 'Test Person', email = freshEmail('person')) {
	const { user } = await auth().api.signUpEmail({
		body: { name, email, password: TEST_PASSWORD }
	});
	return { id: user.id, name, email, password: TEST_PASSWORD };
}

/** Makes someone a member of the store with the role: a new login, or `login` when given. */
export async function addPerson(
	store: TestStore,
	role: Role,
	options: { name?: string; login?: Omit<Person, 'role'> } = {}
): Promise<Person> {
	const login = options.login ?? (await makeLogin(options.name ?? `Test ${role}`));
	await auth().api.addMember({ body: { userId: login.id, role, organizationId: store.id } });
	const person = { ...login, role };
	store.people.push(person);
	return person;
}

/** The store's n-th person with the role; throws when there is none. */
export function personOf(store: TestStore, role: Role, n = 0): Person {
	const found = store.people.filter((p) => p.role === role)[n];
	if (!found) throw new Error(`${store.name} has no ${role} number ${n + 1}: add one in makeStore`);
	return found;
}

function noPriceBook(): string {
	throw new Error('This store has no price book: makeStore({ priceBook: true })');
}

/** A store of the test's own: an owner, the people asked for, and what the options add. */
export async function makeStore(options: StoreOptions = {}): Promise<TestStore> {
	const name = options.name ?? unique('Test Floors');
	const owner = await makeLogin(options.owner ?? 'Test Owner');
	const org = await auth().api.createOrganization({
		body: { name, slug: unique('store').toLowerCase(), userId: owner.id }
	});
	if (!org) throw new Error(`The store ${name} was not made`);
	const store: TestStore = {
		id: org.id,
		name,
		people: [{ ...owner, role: 'owner' }],
		stripeAccount: null,
		floor: noPriceBook
	};
	for (const wanted of options.people ?? []) {
		const { role, ...rest } = typeof wanted === 'string' ? { role: wanted } : wanted;
		await addPerson(store, role, rest);
	}
	if (options.priceBook) store.floor = await q.addPriceBook(store.id);
	if (options.stripe) {
		store.stripeAccount = `acct_e2e${randomBytes(6).toString('hex')}`;
		await q.setStripeAccount(store.id, store.stripeAccount);
	}
	return store;
}

export interface SiteSpec {
	label?: string;
	address: string;
	town?: string;
	builtYear?: number | null;
	subfloor?: string;
}

export interface TestCustomer {
	id: string;
	name: string;
	email: string | null;
	/** The customer's first site, when one was made. */
	site: { id: string; address: string } | null;
}

/** A customer of the store, with a site (`label` Home, town Bramblefield) when one is given. */
export async function makeCustomer(
	store: TestStore,
	spec: {
		name?: string;
		email?: string | null;
		phone?: string | null;
		notes?: string;
		site?: SiteSpec;
	} = {}
): Promise<TestCustomer> {
	const row = await q.addCustomer(store.id, {
		name: spec.name ?? 'Test Customer',
		email: spec.email === undefined ? freshEmail('customer') : spec.email,
		phone: spec.phone ?? null,
		notes: spec.notes ?? ''
	});
	let site: TestCustomer['site'] = null;
	if (spec.site) {
		const made = await q.addSite(store.id, row.id, {
			label: spec.site.label ?? 'Home',
			address: spec.site.address,
			town: spec.site.town ?? 'Bramblefield',
			postcode: '',
			builtYear: spec.site.builtYear ?? null,
			subfloor: spec.site.subfloor ?? '',
			notes: ''
		});
		site = { id: made.id, address: made.address };
	}
	return { id: row.id, name: row.name, email: row.email, site };
}

/**
 * One of the demo's customers (scripts/seed.ts) in the test's store, with their demo home where
 * they have one; `email` replaces theirs (a test that follows a mailed link needs its own).
 */
export async function demoCustomer(
	store: TestStore,
	name: string,
	options: { email?: string } = {}
): Promise<TestCustomer> {
	const index = CUSTOMERS.findIndex((c) => c.name === name);
	if (index < 0) throw new Error(`No demo customer called ${name}`);
	const home = SITES[index];
	return makeCustomer(store, {
		...CUSTOMERS[index],
		...options,
		site: home && { ...home, town: 'Bramblefield' }
	});
}

export interface TestJob {
	id: string;
	number: number;
	title: string;
	customer: TestCustomer;
}

/** The states a job passes through on its way to `to` (PRODUCT.md, "States"). */
function pathTo(to: JobStatus): JobStatus[] {
	if (to === 'cancelled') return ['cancelled'];
	return JOB_STATUSES.slice(1, JOB_STATUSES.indexOf(to) + 1);
}

/**
 * A job for the customer at their site, walked to `to` the way the product walks it (the quote
 * built from `measure` and sent, accepted, the deposit paid at the counter, `installer` booked).
 * Quoting needs a measure and a price book; booking needs an installer. An installer given for a
 * job that is not booked is simply assigned to it.
 */
export async function makeJob(
	store: TestStore,
	spec: {
		customer: TestCustomer;
		title?: string;
		measure?: q.MeasureDraft;
		to?: JobStatus;
		seller?: Person;
		installer?: Person;
	}
): Promise<TestJob> {
	const title = spec.title ?? unique('Job');
	const owner = store.people[0];
	const seller = spec.seller ?? store.people.find((p) => p.role === 'sales') ?? owner;
	const manager = store.people.find((p) => p.role === 'manager') ?? owner;
	const path = pathTo(spec.to ?? 'draft');
	if (path.includes('scheduled') && !spec.installer) {
		throw new Error(`Booking ${title} needs an installer: makeJob(store, { installer })`);
	}
	const row = await q.addJob(
		store.id,
		{
			customerId: spec.customer.id,
			title,
			siteId: spec.customer.site?.id,
			measure: spec.measure
		},
		seller.id
	);
	await q.moveJob(
		store.id,
		{ id: row.id, title, customer: spec.customer },
		path,
		{ seller: seller.id, manager: manager.id, installer: spec.installer?.id },
		row.number
	);
	if (spec.installer && !path.includes('scheduled')) {
		await q.assignJob(store.id, row.id, spec.installer.id, manager.id);
	}
	return { id: row.id, number: row.number, title, customer: spec.customer };
}

/**
 * One of the demo's jobs by its title (scripts/seed.ts): its customer and home, its measure with
 * the store's floors, walked to the state the demo has it in. The store needs `priceBook: true`,
 * and an installer where the job is booked (the store's first, or `installer`).
 */
export async function demoJob(
	store: TestStore,
	title: string,
	options: { customerEmail?: string; installer?: Person; seller?: Person } = {}
): Promise<TestJob> {
	const demo = JOBS.find((j) => j.title === title);
	if (!demo) throw new Error(`No demo job called ${title}`);
	const customer = await demoCustomer(
		store,
		CUSTOMERS[demo.customer].name,
		options.customerEmail ? { email: options.customerEmail } : {}
	);
	const booked = demo.installer !== undefined;
	return makeJob(store, {
		customer,
		title,
		measure: q.demoMeasureOf(title, store.floor),
		to: demo.path.at(-1) ?? 'draft',
		seller: options.seller,
		installer: booked ? (options.installer ?? personOf(store, 'installer')) : undefined
	});
}

/** The customer's link to a job, signed as the server signs it (valid 90 days). */
export function customerLink(store: { id: string }, job: { id: string }) {
	const secret = process.env.BETTER_AUTH_SECRET;
	if (!secret) throw new Error('Run the browser tests through `npm test`');
	const expiresAt = new Date(Date.now() + 90 * 86_400_000);
	return `${ORIGIN}/c/${signLink({ storeId: store.id, jobId: job.id, expiresAt }, secret)}`;
}

/**
 * Pays what the customer's page asks for (the deposit, or the balance) on the Stripe fake's
 * checkout, as a browser without JavaScript would; the fake delivers its webhooks before it
 * answers. Returns the Checkout Session's id.
 */
export async function payByCard(
	request: APIRequestContext,
	link: string,
	options: { purpose?: 'deposit' | 'balance'; email?: string } = {}
) {
	const form = { headers: { origin: ORIGIN, accept: 'text/html' }, maxRedirects: 0 };
	const started = await request.post(`${new URL(link).pathname}?/pay`, {
		...form,
		form: { purpose: options.purpose ?? 'deposit' }
	});
	expect(started.status(), 'the customer page starts a checkout').toBe(303);
	const session = /cs_\w+/.exec(started.headers().location ?? '')?.[0];
	if (!session) throw new Error(`No checkout session in ${started.headers().location}`);
	const paid = await request.post(`/dev/checkout/${session}?/pay`, {
		...form,
		form: { card: 'success', email: options.email ?? 'payer@example.com' }
	});
	expect(paid.status(), 'the fake checkout takes the card').toBe(303);
	return session;
}
