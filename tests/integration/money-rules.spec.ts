// Issue 9, items 9 and 11: refunds that say why and a ledger that follows the reason, a notice to
// the customer for every refund, a cancelled job's quote withdrawn from the customer's link, links
// staff can withdraw, and moves by hand that skip no step.
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import { customerLink } from '$lib/server/customer-page';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tasks from '$lib/server/db/queries/tasks';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { moveByHand } from '$lib/server/jobs/move';
import { recordInStore } from '$lib/server/payments/record';
import { refundCard, refundInStore } from '$lib/server/payments/refunds';
import { handleEvent } from '$lib/server/payments/webhook';
import { sendQuote } from '$lib/server/quotes/send';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import { isHttpError } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { acceptedJob, depositSession, eventsFor } from './card-jobs';
import { makeQuotedJob, makeStore, type TestStore } from './factories';

let t: ReturnType<typeof stripeFakeForTests>;
beforeAll(() => {
	t = stripeFakeForTests({ dataDir: null, webhookSecret: LOCAL_STRIPE_WEBHOOK_SECRET });
});
afterAll(async () => {
	await t.close();
});

const customerPage = await import('../../src/routes/c/[token]/+page.server');
type Actions = typeof customerPage.actions;

const money = (store: TestStore, jobId: string) =>
	readInStore(store.id, (tx) => payments.moneyFor(tx, jobId));
const refundNotices = (store: TestStore) =>
	readInStore(store.id, (tx) => tasks.list(tx, ['queued', 'done', 'failed', 'dropped'], 200)).then(
		(rows) => rows.filter((r) => r.summary.startsWith('Refund notice'))
	);

/** A job with its deposit paid in cash, the customer with an e-mail address. */
async function cashDeposit(name: string) {
	const { store, job, quote } = await acceptedJob(name);
	const paid = await inStore(store.id, (tx) =>
		recordInStore(
			tx,
			job.id,
			{ purpose: 'deposit', method: 'cash', amountCents: quote.depositCents, reference: '' },
			store.owner.id
		)
	);
	if (!paid.ok) throw new Error(paid.reason);
	return { store, job, quote, payment: paid.payment };
}

describe('a refund follows its reason', () => {
	it('for an overcharge: a credit line, the balance and deposit do not move, partly refunded, the customer told', async () => {
		const { store, job, payment } = await cashDeposit('Overcharge Floors');
		const before = (await money(store, job.id)).ledger;
		const refunded = await inStore(store.id, (tx) =>
			refundInStore(
				tx,
				payment.id,
				{ amountCents: Math.min(15_000, payment.amountCents - 1), reason: 'overcharge', note: '' },
				store.owner.id
			)
		);
		expect(refunded.ok).toBe(true);
		const after = await money(store, job.id);
		expect(after.ledger.balanceDueCents).toBe(before.balanceDueCents);
		expect(after.ledger.depositDueCents).toBe(0);
		expect(after.ledger.creditsCents).toBeGreaterThan(0);
		expect(after.payments[0].status).toBe('succeeded');
		expect(after.payments[0].refundedCents).toBeLessThan(after.payments[0].amountCents);
		const notices = await refundNotices(store);
		expect(notices.map((n) => n.summary)).toEqual(['Refund notice to customer@test.example']);
	});

	it('for a cancellation: the job’s money closes and nothing is due', async () => {
		const { store, job, payment } = await cashDeposit('Cancel Refund Floors');
		await inStore(store.id, (tx) =>
			moveByHand(tx, job.id, 'cancelled', store.owner.id, 'Customer moved away')
		);
		await inStore(store.id, (tx) =>
			refundInStore(
				tx,
				payment.id,
				{ amountCents: payment.amountCents, reason: 'cancellation', note: '' },
				store.owner.id
			)
		);
		const after = await money(store, job.id);
		expect(after.ledger).toMatchObject({ balanceDueCents: 0, depositDueCents: 0, closed: true });
		expect(after.payments[0].status).toBe('refunded');
	});

	it('by card in two parts: partly refunded, then refunded; each one e-mailed once', async () => {
		const { store, account, job } = await acceptedJob('Card Refund Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		await t.fake.pay(await depositSession(t, store, job.id), 'success');
		for (const e of eventsFor(t, account, since)) await handleEvent(e, t.stripe);
		const [paid] = (await money(store, job.id)).payments;
		const before = (await money(store, job.id)).ledger;
		const part = Math.floor(paid.amountCents / 4);
		const input = { amountCents: part, reason: 'overcharge' as const, note: '' };
		expect(await refundCard(store.id, paid.id, input, store.owner.id, t.stripe)).toEqual({
			ok: true
		});
		let after = await money(store, job.id);
		expect(after.payments[0]).toMatchObject({ status: 'succeeded', refundedCents: part });
		expect(after.ledger.balanceDueCents).toBe(before.balanceDueCents);
		expect(after.ledger.depositDueCents).toBe(0);
		const rest = { ...input, amountCents: paid.amountCents - part, reason: 'other' as const };
		expect(await refundCard(store.id, paid.id, rest, store.owner.id, t.stripe)).toEqual({
			ok: true
		});
		// Webhooks for the same refunds change nothing and tell nobody twice.
		for (const e of eventsFor(t, account, since)) await handleEvent(e, t.stripe);
		after = await money(store, job.id);
		expect(after.payments[0]).toMatchObject({
			status: 'refunded',
			refundedCents: paid.amountCents
		});
		expect(after.ledger.depositDueCents).toBe(0);
		expect(await refundNotices(store)).toHaveLength(2);
	});
});

/** Calls a customer page action as a browser posting its form would. */
async function answer(action: keyof Actions, token: string, form: Record<string, string>) {
	const body = new FormData();
	for (const [k, v] of Object.entries(form)) body.set(k, v);
	const request = new Request(`http://127.0.0.1:4173/c/${token}?/${action}`, {
		method: 'POST',
		body
	});
	try {
		return await (customerPage.actions[action] as (e: unknown) => Promise<unknown>)({
			params: { token },
			request,
			getClientAddress: () => '127.0.0.1',
			url: new URL(request.url)
		});
	} catch (e) {
		if (isHttpError(e)) return { httpStatus: e.status, message: e.body.message };
		throw e;
	}
}

const tokenOf = (link: string) => new URL(link).pathname.split('/').at(-1)!;

describe('a cancelled job’s quote', () => {
	it('is withdrawn: the customer can neither accept it (no 500) nor ask for changes', async () => {
		const store = await makeStore('Withdrawn Floors');
		const made = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			sendQuote(tx, made.quote.id, { to: 'c@test.example', validDays: 30, actorId: store.owner.id })
		);
		const token = tokenOf(await readInStore(store.id, (tx) => customerLink(tx, made.job.id)));
		const moved = await inStore(store.id, (tx) =>
			moveByHand(tx, made.job.id, 'cancelled', store.owner.id, 'Customer chose another store')
		);
		expect(moved.ok).toBe(true);
		expect((await readInStore(store.id, (tx) => quotes.read(tx, made.quote.id)))?.status).toBe(
			'withdrawn'
		);
		const accepted = await answer('accept', token, { quoteId: made.quote.id, name: 'Ada Quill' });
		expect(accepted).toMatchObject({ status: 409, data: { message: /withdrew/ } });
		const changes = await answer('changes', token, { quoteId: made.quote.id, note: 'Cheaper' });
		expect(changes).toMatchObject({ status: 409, data: { message: /withdrew/ } });
		const job = await readInStore(store.id, (tx) => jobs.readForStore(tx, made.job.id));
		expect(job?.status).toBe('cancelled');
	});
});

describe('the customer’s link', () => {
	it('can be withdrawn by staff: the old one says so, the new one works', async () => {
		const store = await makeStore('Link Floors');
		const made = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			customers.update(tx, made.customer.id, { email: 'c@test.example' })
		);
		await inStore(store.id, (tx) =>
			sendQuote(tx, made.quote.id, { to: 'c@test.example', validDays: 30, actorId: store.owner.id })
		);
		const old = tokenOf(await readInStore(store.id, (tx) => customerLink(tx, made.job.id)));
		await inStore(store.id, (tx) => jobs.raiseLinkVersion(tx, made.job.id));
		const fresh = tokenOf(await readInStore(store.id, (tx) => customerLink(tx, made.job.id)));
		expect(fresh).not.toBe(old);
		const refused = await answer('changes', old, { quoteId: made.quote.id, note: 'x' });
		expect(refused).toMatchObject({ httpStatus: 410, message: /replaced or withdrawn/ });
		const fine = await answer('changes', fresh, { quoteId: made.quote.id, note: 'Lighter oak' });
		expect(fine).toEqual({ changesSent: true });
	});
});

describe('moves by hand', () => {
	it('refuse quoted without a sent quote, sold without the deposit, scheduled without a booking', async () => {
		const store = await makeStore('Step Floors');
		const made = await makeQuotedJob(store);
		const move = (to: Parameters<typeof moveByHand>[2]) =>
			inStore(store.id, (tx) => moveByHand(tx, made.job.id, to, store.owner.id));
		expect(await move('quoted')).toMatchObject({ ok: false, message: /Send the quote first/ });
		await inStore(store.id, (tx) =>
			sendQuote(tx, made.quote.id, { to: 'c@test.example', validDays: 30, actorId: store.owner.id })
		);
		expect(await move('accepted')).toMatchObject({ ok: false, message: /customer accepts/ });
		const { store: other, job } = await acceptedJob('Step Deposit Floors');
		expect(
			await inStore(other.id, (tx) => moveByHand(tx, job.id, 'sold', other.owner.id))
		).toMatchObject({ ok: false, message: /deposit/ });
		const status = await readInStore(other.id, (tx) => jobs.readForStore(tx, job.id));
		expect(status?.status).toBe('accepted');
		const sold = await cashDeposit('Step Booking Floors');
		expect(
			(await readInStore(sold.store.id, (tx) => jobs.readForStore(tx, sold.job.id)))?.status
		).toBe('sold');
		expect(
			await inStore(sold.store.id, (tx) =>
				moveByHand(tx, sold.job.id, 'scheduled', sold.store.owner.id)
			)
		).toMatchObject({ ok: false, message: /Book an installer/ });
		expect(
			await inStore(sold.store.id, (tx) =>
				moveByHand(tx, sold.job.id, 'completed', sold.store.owner.id)
			)
		).toMatchObject({ ok: false, message: /cannot become completed/ });
	});
});
