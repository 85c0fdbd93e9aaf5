import { grantsOf } from '$lib/server/permissions';
// One database transaction per request: the job page and the customer's page (/c/[token]) run
// every query of their load on one connection, between one BEGIN and one COMMIT. Counted at the
// pg driver, below Drizzle, so nothing the app does can hide a statement.
import { customerLink } from '$lib/server/customer-page';
import { readInStore } from '$lib/server/db/tenant';
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import pg from 'pg';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { addMember, makePaidJob, makeStore, type TestStore } from './factories';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));

const jobPage = await import('../../src/routes/app/jobs/[id]/+page.server');
const customerPage = await import('../../src/routes/c/[token]/+page.server');

interface Statement {
	client: pg.Client;
	text: string;
}

/** Every statement any pg client sends while `work` runs, with the client that sent it. */
async function statementsOf(work: () => Promise<unknown>): Promise<Statement[]> {
	const seen: Statement[] = [];
	const original = pg.Client.prototype.query;
	const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (
		this: pg.Client,
		...args: unknown[]
	) {
		const first = args[0] as string | { text?: string };
		const text = typeof first === 'string' ? first : (first?.text ?? '');
		seen.push({ client: this, text: text.trim() });
		return (original as (...a: unknown[]) => unknown).apply(this, args);
	} as typeof original);
	try {
		await work();
	} finally {
		spy.mockRestore();
	}
	return seen;
}

const isBegin = (s: Statement) => /^begin\b/i.test(s.text);
const isEnd = (s: Statement) => /^(commit|rollback)\b/i.test(s.text);

/** The statements form one transaction: BEGIN first, COMMIT last, one client, nothing else. */
function expectOneTransaction(statements: Statement[]) {
	expect(statements.length).toBeGreaterThan(3);
	expect(statements.filter(isBegin)).toHaveLength(1);
	expect(statements.filter(isEnd).map((s) => s.text.toLowerCase())).toEqual(['commit']);
	expect(isBegin(statements[0])).toBe(true);
	expect(statements.at(-1)!.text.toLowerCase()).toBe('commit');
	expect(new Set(statements.map((s) => s.client)).size).toBe(1);
}

let store: TestStore;
let made: Awaited<ReturnType<typeof makePaidJob>>;
let manager: Awaited<ReturnType<typeof addMember>>;

beforeAll(async () => {
	store = await makeStore('One Transaction Floors');
	made = await makePaidJob(store);
	manager = await addMember(store.id, 'manager', 'Tess Manager');
});

afterEach(() => {
	current = undefined;
});

function memberEvent(path: string, params: Record<string, string>) {
	const url = new URL(`http://127.0.0.1:4173${path}`);
	const e = {
		url,
		params,
		request: new Request(url),
		setHeaders: () => {},
		locals: {
			user: manager as App.Locals['user'],
			session: { id: `session-${manager.id}` } as App.Locals['session'],
			store: { id: store.id, name: store.name, slug: 'test', logo: null, timeZone: 'UTC' },
			role: 'manager',
			grants: grantsOf('manager'),
			denied: null
		}
	} as unknown as RequestEvent;
	current = e;
	return e;
}

describe('one transaction per request', () => {
	it('for the job page, with its history, quote, money, site and measure', async () => {
		let data: Record<string, unknown> = {};
		const statements = await statementsOf(async () => {
			data = (await jobPage.load(
				memberEvent(`/app/jobs/${made.job.id}`, { id: made.job.id }) as never
			)) as Record<string, unknown>;
		});
		// The load did read all of it: the page is whole.
		expect(data).toMatchObject({
			job: { id: made.job.id, status: 'sold' },
			quotes: [{ status: 'accepted' }],
			money: { count: 1 },
			site: { current: { id: made.site.id } },
			measure: { rooms: 1 }
		});
		expect((data.timeline as unknown[]).length).toBeGreaterThan(2);
		expectOneTransaction(statements);
	});

	it("for the customer's page, with the store, quote, money and site", async () => {
		const link = await readInStore(store.id, (tx) => customerLink(tx, made.job.id));
		const token = new URL(link).pathname.split('/').at(-1)!;
		const url = new URL(`http://127.0.0.1:4173/c/${token}`);
		let data: Record<string, unknown> = {};
		const statements = await statementsOf(async () => {
			data = (await customerPage.load({
				url,
				params: { token },
				setHeaders: () => {}
			} as never)) as Record<string, unknown>;
		});
		expect(data).toMatchObject({
			store: { name: store.name },
			job: { status: 'sold' },
			quote: { id: made.quote.id, status: 'accepted' },
			site: { address: made.site.address }
		});
		expectOneTransaction(statements);
	});

	it('and a page whose job is not there rolls its one transaction back, with a 404', async () => {
		let thrown: unknown;
		const statements = await statementsOf(async () => {
			try {
				await jobPage.load(memberEvent('/app/jobs/nothing-here', { id: 'nothing-here' }) as never);
			} catch (e) {
				thrown = e;
			}
		});
		expect(isHttpError(thrown) && thrown.status).toBe(404);
		expect(statements.filter(isBegin)).toHaveLength(1);
		expect(statements.filter(isEnd).map((s) => s.text.toLowerCase())).toEqual(['rollback']);
	});
});
