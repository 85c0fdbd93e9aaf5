// The demo: an invented store in an invented town, one login per role, customers and jobs.
// Run by `npm start` when the database is empty, and by the end-to-end tests after a reset.
//   tsx scripts/seed.ts            seed when there are no users yet
//   tsx scripts/seed.ts --reset    empty every table first (needs DATABASE_OWNER_URL)
import pg from 'pg';
import demo from './demo-people.json' with { type: 'json' };
import { createAuth } from '../src/lib/server/create-auth';
import { db, pool } from '../src/lib/server/db/index';
import * as customers from '../src/lib/server/db/queries/customers';
import * as jobs from '../src/lib/server/db/queries/jobs';
import * as priceBook from '../src/lib/server/db/queries/price-book';
import * as sites from '../src/lib/server/db/queries/sites';
import * as tradeSettings from '../src/lib/server/db/queries/settings';
import { saveProfile } from '../src/lib/server/db/queries/stores';
import { defaultSettings } from '../src/lib/estimating';
import { demoFloors, samplePriceBook } from '../src/lib/estimating/sample';
import { EXISTING_FLOOR_LABELS, PREP_LABELS } from '../src/lib/measure/labels';
import * as measures from '../src/lib/server/db/queries/measures';
import * as payments from '../src/lib/server/db/queries/payments';
import * as quotes from '../src/lib/server/db/queries/quotes';
import { inStore, type StoreWriteTx } from '../src/lib/server/db/tenant';
import { recordInStore } from '../src/lib/server/payments/record';
import { buildQuote } from '../src/lib/server/quotes/build';
import { freezeQuote } from '../src/lib/server/quotes/freeze';
import { recordAcceptance } from '../src/lib/server/quotes/record-answer';
import { bookJob } from '../src/lib/server/schedule/book';
import { addDays, today } from '../src/lib/schedule/days';
import { demoMeasure } from './demo-measures';
import type { JobStatus } from '../src/lib/jobs/status';
import type { Role } from '../src/lib/server/permissions';

export const DEMO_PASSWORD = demo.password;

/** The demo's logins (`npm start` prints them from the same file). */
export const DEMO_PEOPLE = demo.people as { name: string; email: string; role: Role }[];

/** A second store in the next town, so one installer works for two stores. */
const SECOND_STORE = {
	name: 'Hollin Vale Tile House',
	owner: { name: 'Ansel Marrow', email: 'owner@hollinvale.example' }
};

/** The demo store's customers (invented people). */
export const CUSTOMERS = [
	{
		name: 'Greta Oakhurst',
		email: 'greta.oakhurst@example.com',
		phone: '555-0142',
		notes: '1962 ranch; kitchen vinyl is original.'
	},
	{ name: 'Felix Brannagh', email: 'felix.b@example.com', phone: '555-0178', notes: '' },
	{
		name: 'Hana Ruskin',
		email: 'hana.ruskin@example.com',
		phone: '555-0119',
		notes: 'Two dogs; gate code 4417.'
	},
	{ name: 'Otto & Lil Vanterpool', email: 'vanterpools@example.com', phone: '555-0163', notes: '' },
	{
		name: 'Marisol Quenby',
		email: 'marisol.q@example.com',
		phone: '555-0107',
		notes: 'Prefers texts.'
	},
	{ name: 'Ivo Thistlewood', email: 'ivo.t@example.com', phone: '555-0191', notes: '' },
	{
		name: 'Beatrix Fallowfield',
		email: 'b.fallowfield@example.com',
		phone: '555-0124',
		notes: 'Asked about stair treads.'
	},
	{ name: 'Cosmo Penhallow', email: null, phone: '555-0186', notes: 'No e-mail: call.' },
	{ name: 'Dagny Wexcombe', email: 'dagny.w@example.com', phone: null, notes: '' },
	{
		name: 'Emrys Calloway',
		email: 'emrys.calloway@example.com',
		phone: '555-0150',
		notes: 'Rental units on Quarry Row.'
	},
	{ name: 'Fenella Ashdown', email: 'fenella.a@example.com', phone: '555-0133', notes: '' },
	{
		name: 'Gideon Marlowe',
		email: 'g.marlowe@example.com',
		phone: '555-0175',
		notes: 'Wants a quote before spring.'
	}
];

/** Where each of the first customers lives (invented streets of Bramblefield). */
export const SITES = [
	{ address: '27 Alder Way', builtYear: 1962, subfloor: 'plywood' },
	{ address: '4 Tannery Lane', builtYear: 1978, subfloor: 'concrete' },
	{ address: '112 Wickett Street', builtYear: 1994, subfloor: 'plywood' },
	{ address: '9 Heron Close', builtYear: 1985, subfloor: 'osb' },
	{ address: '58 Cobble Rise', builtYear: 1971, subfloor: 'plywood' },
	{ address: '3 Larkspur Court', builtYear: 2004, subfloor: 'plywood' }
];

/** Jobs and the statuses they walk through (every state of PRODUCT.md appears once). */
export const JOBS: { customer: number; title: string; path: JobStatus[]; installer?: number }[] = [
	{ customer: 0, title: 'Kitchen and hall, vinyl plank', path: [] },
	{ customer: 1, title: 'Basement carpet', path: ['quoted'] },
	{ customer: 2, title: 'Living room oak', path: ['quoted', 'accepted'] },
	{ customer: 3, title: 'Two bedrooms, carpet', path: ['quoted', 'accepted', 'sold'] },
	{
		customer: 4,
		title: 'Bathroom tile',
		path: ['quoted', 'accepted', 'sold', 'scheduled'],
		installer: 4
	},
	{
		customer: 5,
		title: 'Sunroom laminate',
		path: ['quoted', 'accepted', 'sold', 'scheduled', 'in_progress'],
		installer: 4
	},
	{
		customer: 0,
		title: 'Laundry sheet vinyl',
		path: ['quoted', 'accepted', 'sold', 'scheduled', 'in_progress', 'completed'],
		installer: 5
	},
	{
		customer: 2,
		title: 'Upstairs landing carpet',
		path: ['quoted', 'accepted', 'sold', 'scheduled', 'in_progress', 'completed', 'closed'],
		installer: 5
	},
	{ customer: 1, title: 'Den engineered wood', path: ['quoted', 'cancelled'] }
];

const noMail = async () => ({ id: 'seed' });

/** The demo store's trade settings and price book (invented products, sensible trade prices). */
export async function seedPriceBook(tx: StoreWriteTx) {
	await tradeSettings.save(tx, {
		settings: {
			...defaultSettings,
			taxes: [{ name: 'Bramblefield sales tax', rateBps: 650, groups: ['material'] }],
			deposit: { percentBps: 3000, minimumCents: 25_000 }
		},
		currency: 'USD',
		quoteValidDays: 30
	});
	const { floors, prep, removal, supplies } = samplePriceBook;
	const floorIds = new Map<string, string>();
	for (const { id: _id, name, ...data } of [...floors, ...demoFloors]) {
		const row = await priceBook.create(tx, { section: 'floor', code: '', name, data });
		floorIds.set(name, row.id);
	}
	for (const item of prep) {
		await priceBook.create(tx, {
			section: 'prep',
			code: item.kind,
			name: PREP_LABELS[item.kind],
			data: item
		});
	}
	for (const item of removal) {
		await priceBook.create(tx, {
			section: 'removal',
			code: item.existing,
			name: `Tear out ${EXISTING_FLOOR_LABELS[item.existing].toLowerCase()}`,
			data: item
		});
	}
	for (const item of supplies) {
		await priceBook.create(tx, {
			section: 'supply',
			code: item.kind,
			name: item.name,
			data: item
		});
	}
	return (name: string) => {
		const id = floorIds.get(name);
		if (!id) throw new Error(`No demo floor called ${name}`);
		return id;
	};
}

/** Who moves a job along: the seller quotes, the manager takes money and moves it on. */
export interface JobWalkers {
	seller: string;
	manager: string;
	/** Booked when the job is scheduled. */
	installer?: string;
}

/**
 * Moves a job along its path the way the product does: the quote is built and sent, the
 * customer accepts it, the deposit (and at closing the balance) is paid at the store's counter,
 * an installer is booked. `n` numbers the slips and cheques. The browser tests' factories use
 * it too (tests/e2e/support/queries.ts).
 */
export async function walkJob(
	tx: StoreWriteTx,
	job: { id: string; title: string; customer: { name: string; email: string | null } },
	path: JobStatus[],
	by: JobWalkers,
	n = 0
) {
	for (const to of path) {
		// Quoting and acceptance go the way they do in the product: build, send, the customer
		// accepts; the made-up customers are sent no e-mail.
		if (to === 'quoted') {
			const built = await buildQuote(tx, job.id, by.seller);
			if (!built.ok) throw new Error(`Demo quote of ${job.title}: ${JSON.stringify(built)}`);
			const sent = await freezeQuote(tx, built.quote.id, {
				to: job.customer.email ?? 'no-email@example.com',
				validDays: 30,
				actorId: by.seller
			});
			if (!sent.ok) throw new Error(`Demo quote of ${job.title} was not sent`);
			continue;
		}
		if (to === 'accepted') {
			const latest = await quotes.forCustomer(tx, job.id);
			const accepted = await recordAcceptance(tx, job.id, latest!.id, {
				name: job.customer.name,
				// An address from the range kept for documentation (RFC 5737).
				ip: '198.51.100.20',
				userAgent: 'demo seed'
			});
			if (!accepted.ok) throw new Error(`Demo quote of ${job.title} was not accepted`);
			continue;
		}
		if (to === 'scheduled' && by.installer) {
			// Booked on the schedule as a manager books it (engine's days, assigned, scheduled),
			// a few days from today; the made-up people are e-mailed nothing.
			const booked = await bookJob(
				tx,
				job.id,
				{
					installerId: by.installer,
					startsOn: addDays(today('UTC'), 2 + n),
					days: null,
					arrivesAt: '08:00',
					notes: ''
				},
				{ id: by.manager, storeName: '' },
				{ tell: false }
			);
			if (!booked.ok)
				throw new Error(`Demo job ${job.title} not booked: ${JSON.stringify(booked)}`);
			continue;
		}
		if (to === 'sold' || to === 'closed') {
			// The deposit on the store's card terminal (the ledger moves the job to sold); at
			// closing, the balance by cheque.
			const deposit = to === 'sold';
			const { ledger } = await payments.moneyFor(tx, job.id);
			const paid = await recordInStore(
				tx,
				job.id,
				{
					purpose: deposit ? 'deposit' : 'balance',
					method: deposit ? 'card_terminal' : 'cheque',
					amountCents: deposit ? ledger.depositDueCents : ledger.balanceDueCents,
					reference: deposit ? `Terminal slip ${4100 + n}` : `Cheque ${880 + n}`
				},
				by.manager
			);
			if (!paid.ok) throw new Error(`Demo payment for ${job.title}: ${paid.reason}`);
			if (deposit) continue;
		}
		const moved = await jobs.move(tx, job.id, to, by.manager);
		if (!moved.ok) throw new Error(`Demo job ${job.title} could not move to ${to}`);
	}
}

export async function seedDemo() {
	const auth = createAuth({
		db,
		baseURL: process.env.ORIGIN ?? 'http://127.0.0.1:3000',
		secret: process.env.BETTER_AUTH_SECRET ?? 'seed-only-secret-seed-only-secret!',
		sendMail: noMail
	});

	const ids = new Map<string, string>();
	for (const person of [...DEMO_PEOPLE, SECOND_STORE.owner]) {
		const { user } = await auth.api.signUpEmail({
			body: { name: person.name, email: person.email, password: DEMO_PASSWORD }
		});
		ids.set(person.email, user.id);
	}
	const ownerId = ids.get(DEMO_PEOPLE[0].email)!;

	const store = await auth.api.createOrganization({
		body: {
			name: 'Tallow Creek Floors',
			slug: 'tallow-creek-floors',
			userId: ownerId,
			timeZone: 'America/Chicago'
		}
	});
	if (!store) throw new Error('The demo store was not created');
	for (const person of DEMO_PEOPLE.slice(1)) {
		await auth.api.addMember({
			body: { userId: ids.get(person.email)!, role: person.role, organizationId: store.id }
		});
	}
	const floor = await inStore(store.id, async (tx) => {
		const floor = await seedPriceBook(tx);
		// Each store's own Stripe account (the local fake keeps each apart, as Stripe does).
		await tradeSettings.saveStripeAccount(tx, 'acct_tallowcreekdemo1');
		await saveProfile(tx, {
			address: '418 Millrace Road',
			town: 'Bramblefield',
			phone: '555-0100',
			email: 'desk@tallowcreek.example'
		});
		return floor;
	});

	const second = await auth.api.createOrganization({
		body: {
			name: SECOND_STORE.name,
			slug: 'hollin-vale-tile-house',
			userId: ids.get(SECOND_STORE.owner.email)!,
			timeZone: 'America/Chicago'
		}
	});
	if (!second) throw new Error('The second demo store was not created');
	await inStore(second.id, (tx) => tradeSettings.saveStripeAccount(tx, 'acct_hollinvaledemo1'));
	// Rosa installs for both stores with one login.
	await auth.api.addMember({
		body: {
			userId: ids.get('installer@tallowcreek.example')!,
			role: 'installer',
			organizationId: second.id
		}
	});
	await inStore(second.id, (tx) =>
		saveProfile(tx, { address: '7 Weir Lane', town: 'Hollin Vale', phone: '555-0200', email: '' })
	);
	await seedJobs(store.id, {
		floor,
		sellers: [ids.get('sales@tallowcreek.example')!, ids.get('jonah@tallowcreek.example')!],
		managerId: ids.get('manager@tallowcreek.example')!,
		installerOf: (n) => ids.get(DEMO_PEOPLE[n].email)!
	});
	await inStore(second.id, (tx) =>
		seedSecondStore(tx, {
			ownerId: ids.get(SECOND_STORE.owner.email)!,
			installerId: ids.get('installer@tallowcreek.example')!
		})
	);
	return { storeId: store.id, secondStoreId: second.id };
}

/**
 * The demo store's customers, their homes and their jobs, each walked as far as its path goes.
 * Each customer and each job is its own transaction, as the product makes them, so that each has
 * its own time (a transaction's rows all carry its start time) and "newest first" means something.
 */
async function seedJobs(
	storeId: string,
	people: {
		floor: (name: string) => string;
		sellers: string[];
		managerId: string;
		installerOf: (index: number) => string;
	}
) {
	const { floor, sellers, managerId } = people;
	const customerRows: Awaited<ReturnType<typeof customers.create>>[] = [];
	for (const c of CUSTOMERS)
		customerRows.push(await inStore(storeId, (tx) => customers.create(tx, c)));
	const siteIds: string[] = [];
	for (const [i, place] of SITES.entries()) {
		const row = await inStore(storeId, (tx) =>
			sites.create(tx, customerRows[i].id, {
				label: 'Home',
				address: place.address,
				town: 'Bramblefield',
				postcode: '',
				builtYear: place.builtYear,
				subfloor: place.subfloor,
				notes: ''
			})
		);
		siteIds.push(row!.id);
	}
	for (const [n, j] of JOBS.entries()) {
		const seller = sellers[n % 2];
		const customer = customerRows[j.customer];
		await inStore(storeId, async (tx) => {
			const job = await jobs.create(tx, { customerId: customer.id, title: j.title }, seller);
			if (!job) throw new Error(`Demo job ${j.title} was not created`);
			await sites.setJobSite(tx, job.id, siteIds[j.customer]);
			const saved = await measures.save(tx, job.id, demoMeasure(j.title, floor), 0, seller);
			if (!saved.ok) throw new Error(`Demo measure of ${j.title} was not saved`);
			await walkJob(
				tx,
				{ id: job.id, title: j.title, customer },
				j.path,
				{
					seller,
					manager: managerId,
					installer: j.installer === undefined ? undefined : people.installerOf(j.installer)
				},
				n
			);
		});
	}
}

/** The second store's customer, site, price and job, for the tenancy checks and Rosa's two stores. */
async function seedSecondStore(tx: StoreWriteTx, people: { ownerId: string; installerId: string }) {
	const hollinCustomer = await customers.create(tx, {
		name: 'Pim Arkwright',
		email: 'pim.arkwright@example.com',
		phone: '555-0231',
		notes: ''
	});
	// A site and a price of the second store, for the tenancy checks.
	await sites.create(tx, hollinCustomer.id, {
		label: 'Home',
		address: '12 Sluice Row',
		town: 'Hollin Vale',
		postcode: '',
		builtYear: 1931,
		subfloor: 'Boards',
		notes: ''
	});
	await priceBook.create(tx, {
		section: 'floor',
		code: '',
		name: 'Hollin porcelain 24 × 24 in',
		data: {
			kind: 'ceramic_tile',
			cartonSqFt: 16,
			tileEdgesIn: [24, 24],
			material: { basis: 'carton', priceCents: 7_200, costCents: 4_300 },
			labourCentsPerSqFt: 700,
			payCentsPerSqFt: 450
		}
	});
	const hollinJob = await jobs.create(
		tx,
		{ customerId: hollinCustomer.id, title: 'Entry hall porcelain' },
		people.ownerId
	);
	if (hollinJob) await jobs.assign(tx, hollinJob.id, people.installerId, people.ownerId);
}

/** Empties every table (as the schema owner; the app's role may not truncate). */
export async function resetDatabase(ownerUrl: string) {
	const client = new pg.Client({ connectionString: ownerUrl });
	await client.connect();
	try {
		const { rows } = await client.query<{ tablename: string }>(
			"select tablename from pg_tables where schemaname = 'public'"
		);
		if (rows.length) {
			await client.query(
				`truncate table ${rows.map((r) => `"${r.tablename}"`).join(', ')} restart identity cascade`
			);
		}
		// Tasks still waiting in the queue were about the data just emptied; the queues stay.
		const queue = await client.query("select 1 from pg_namespace where nspname = 'pgboss'");
		if (queue.rowCount) await client.query('truncate table pgboss.job, pgboss.archive');
	} finally {
		await client.end();
	}
}

async function isEmpty() {
	const { rows } = await pool.query<{ n: string }>('select count(*) as n from "user"');
	return Number(rows[0].n) === 0;
}

async function main() {
	if (process.argv.includes('--reset')) {
		const ownerUrl = process.env.DATABASE_OWNER_URL;
		if (!ownerUrl) throw new Error('--reset needs DATABASE_OWNER_URL');
		await resetDatabase(ownerUrl);
	}
	if (await isEmpty()) {
		await seedDemo();
		console.log('Seeded the demo store.');
	} else {
		console.log('The database has data: the demo seed is skipped.');
	}
	await pool.end();
}

if (import.meta.url === `file://${process.argv[1]}`) {
	main().catch((e) => {
		console.error(e);
		process.exit(1);
	});
}
