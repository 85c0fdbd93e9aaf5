// The customer's side of completion: the finished job on their link (photos, walk-through notes),
// the sign-off with typed name, time, address and browser (once), the balance e-mail queued once
// (by the completion or, failing that, the sign-off), the balance to the cent with an approved
// change order and a refund, paid through the same Checkout path, and the job closed only after
// sign-off and full payment.
import { formatMoney } from '$lib/format';
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import { customerLink } from '$lib/server/customer-page';
import { approveChangeOrder } from '$lib/server/change-orders/answer';
import { changeOrderFromReport } from '$lib/server/change-orders/from-report';
import { sendChangeOrder } from '$lib/server/change-orders/review';
import * as completions from '$lib/server/db/queries/completions';
import * as payments from '$lib/server/db/queries/payments';
import { task } from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { moveByHand } from '$lib/server/jobs/move';
import { startCheckout } from '$lib/server/payments/checkout';
import { refundInStore } from '$lib/server/payments/refunds';
import { handleEvent } from '$lib/server/payments/webhook';
import { requestBalance } from '$lib/server/sign-off/balance';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import { isActionFailure, isHttpError, type RequestEvent } from '@sveltejs/kit';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eventsFor } from './card-jobs';
import {
	completeJob,
	CUSTOMER_EMAIL,
	jobOnSite,
	recordFound,
	recordPhoto,
	soldOf,
	type OnSite
} from './change-order-jobs';
import { TEST_ORIGIN } from './factories';

const customerPage = await import('../../src/routes/c/[token]/+page.server');
const customerPhoto = await import('../../src/routes/c/[token]/photos/[photo]/+server');

let t: ReturnType<typeof stripeFakeForTests>;
beforeAll(() => {
	t = stripeFakeForTests({ dataDir: null, webhookSecret: LOCAL_STRIPE_WEBHOOK_SECRET });
});
afterAll(async () => {
	await t.close();
});

const HOLE = { type: 'prep', kind: 'hole_repair' } as const;

/**
 * A job on site whose report found one more hole than was sold, priced into a change order the
 * customer approved: $85.00 on the sample book, no tax on prep in the test store.
 */
async function withApprovedExtra(name: string) {
	const site = await jobOnSite(name);
	const hole = soldOf(site, HOLE);
	const [item] = await recordFound(site, [
		{ ref: HOLE, qty: hole.qty + 1, unit: 'each', roomId: hole.roomId }
	]);
	const co = await inStore(site.store.id, async (tx) => {
		const made = await changeOrderFromReport(tx, site.report.id, site.installer.id);
		if (!made.ok || !made.changeOrder) throw new Error('no change order');
		const sent = await sendChangeOrder(tx, site.job.id, made.changeOrder.id, {
			to: CUSTOMER_EMAIL,
			actorId: site.store.owner.id
		});
		if (!sent.ok) throw new Error(sent.reason);
		const approved = await approveChangeOrder(tx, site.job.id, made.changeOrder.id, {
			name: 'Wren Alder',
			ip: null,
			userAgent: null
		});
		if (!approved.ok) throw new Error(approved.reason);
		return approved.changeOrder;
	});
	expect(co.totalCents).toBe(8_500);
	return { site, co, item };
}

const tokenOf = async (site: OnSite) =>
	(await readInStore(site.store.id, (tx) => customerLink(tx, site.job.id))).split('/c/')[1];

async function statusOf(run: () => unknown): Promise<{ status: number; body?: unknown }> {
	try {
		const answer = await run();
		if (isActionFailure(answer)) return { status: answer.status, body: answer.data };
		return { status: 200, body: answer };
	} catch (e) {
		if (isHttpError(e)) return { status: e.status };
		throw e;
	}
}

function signOff(token: string, name: string) {
	const form = new FormData();
	form.append('name', name);
	const url = new URL(`${TEST_ORIGIN}/c/${token}?/signOff`);
	const event = {
		url,
		params: { token },
		request: new Request(url, {
			method: 'POST',
			body: form,
			headers: { 'user-agent': 'Porch Tablet 2.0', origin: TEST_ORIGIN }
		}),
		getClientAddress: () => '198.51.100.23',
		setHeaders: () => {}
	} as unknown as RequestEvent;
	return statusOf(() => (customerPage.actions.signOff as (e: RequestEvent) => unknown)(event));
}

async function customerLoad(token: string) {
	return (await customerPage.load({
		params: { token },
		url: new URL(`${TEST_ORIGIN}/c/${token}`),
		setHeaders: () => {}
	} as unknown as Parameters<typeof customerPage.load>[0])) as Exclude<
		Awaited<ReturnType<typeof customerPage.load>>,
		void
	>;
}

/** The balance e-mails queued for a job. */
const balanceMails = (site: OnSite) =>
	readInStore(site.store.id, (tx) =>
		tx
			.select({ payload: task.payload })
			.from(task)
			.where(
				and(
					eq(task.organizationId, site.store.id),
					eq(task.jobId, site.job.id),
					sql`${task.payload}->>'purpose' = 'balance-request'`
				)
			)
	);

describe('the balance', () => {
	it('is the quote and the approved change order less payments net of refunds, to the cent', async () => {
		const { site, co } = await withApprovedExtra('Balance Floors');
		// The deposit paid in cash, then $25.00 of it given back (reason "other": owed again).
		await inStore(site.store.id, async (tx) => {
			const given = await refundInStore(
				tx,
				site.payment.id,
				{ amountCents: 2_500, reason: 'other', note: 'Paid twice at the counter' },
				site.store.owner.id
			);
			if (!given.ok) throw new Error(given.reason);
		});
		const money = await readInStore(site.store.id, (tx) => payments.moneyFor(tx, site.job.id));
		// quote + change order − deposit + the $1.00 overcharge refund − its $1.00 credit + $25.00
		const expected = site.quote.totalCents + 8_500 - site.quote.depositCents + 100 - 100 + 2_500;
		expect(money.ledger.owedCents).toBe(site.quote.totalCents + 8_500);
		expect(money.ledger.netPaidCents).toBe(site.quote.depositCents - 100 - 2_500);
		expect(money.ledger.balanceDueCents).toBe(expected);

		// Not before the job is finished.
		expect(await inStore(site.store.id, (tx) => requestBalance(tx, site.job.id))).toEqual({
			queued: false,
			reason: 'not_completed'
		});
		await completeJob(site);
		const asked = await inStore(site.store.id, (tx) => requestBalance(tx, site.job.id));
		expect(asked).toEqual({ queued: true, balanceDueCents: expected });
		const [mail] = await balanceMails(site);
		const sent = (mail.payload as { mail: { to: string; text: string } }).mail;
		expect(sent.to).toBe(CUSTOMER_EMAIL);
		expect(sent.text).toContain(formatMoney(expected, 'USD'));
		expect(sent.text).toContain('/c/');

		// The customer pays it through Checkout: the change order is in the amount.
		const token = await tokenOf(site);
		const since = Math.floor(Date.now() / 1000) - 1;
		const started = await startCheckout(
			{ storeId: site.store.id, jobId: site.job.id, purpose: 'balance', linkToken: token },
			t.stripe
		);
		if (!started.ok) throw new Error(started.reason);
		const session = /\/dev\/checkout\/(cs_[\w]+)/.exec(started.url)![1];
		const retrieved = await t.stripe.checkout.sessions.retrieve(session, undefined, {
			stripeAccount: site.account
		});
		expect(retrieved.amount_total).toBe(expected);
		// Once the job is finished the balance takes the change order in: no separate payment.
		expect((await customerLoad(token)).changeOrders[0]).toMatchObject({ payable: false });
		expect(
			await startCheckout(
				{
					storeId: site.store.id,
					jobId: site.job.id,
					purpose: 'change_order',
					changeOrderId: co.id,
					linkToken: token
				},
				t.stripe
			)
		).toMatchObject({ ok: false, reason: 'not_payable' });
		await t.fake.pay(session, 'success');
		for (const e of eventsFor(t, site.account, since)) await handleEvent(e, t.stripe);
		const after = await readInStore(site.store.id, (tx) => payments.moneyFor(tx, site.job.id));
		expect(after.ledger.balanceDueCents).toBe(0);

		// Paid in full but not signed off: not closed yet. Signed off: closed.
		const early = await inStore(site.store.id, (tx) =>
			moveByHand(tx, site.job.id, 'closed', site.store.owner.id)
		);
		expect(early).toMatchObject({ ok: false, reason: 'refused' });
		expect((await signOff(token, 'Wren Alder')).status).toBe(200);
		const closed = await inStore(site.store.id, (tx) =>
			moveByHand(tx, site.job.id, 'closed', site.store.owner.id)
		);
		expect(closed.ok).toBe(true);
		// The sign-off did not ask for the balance again.
		expect(await balanceMails(site)).toHaveLength(1);
	});
});

describe('the customer’s sign-off', () => {
	it('shows the finished work, is kept with name, time, address and browser, and is signed once', async () => {
		const { site, item } = await withApprovedExtra('Signing Floors');
		const token = await tokenOf(site);
		expect((await signOff(token, 'Wren Alder')).status).toBe(409);

		await completeJob(site, 'Threshold at the back door checked with the customer');
		const photo = await recordPhoto(site, item, 'completion');
		const page = await customerLoad(token);
		expect(page.completion).toMatchObject({
			notes: 'Threshold at the back door checked with the customer',
			signedAt: null,
			photos: [{ id: photo.id, caption: '' }]
		});
		const served = await customerPhoto.GET({
			params: { token, photo: photo.id },
			url: new URL(`${TEST_ORIGIN}/c/${token}/photos/${photo.id}`),
			setHeaders: () => {}
		} as unknown as Parameters<typeof customerPhoto.GET>[0]);
		expect(served.status).toBe(200);

		const blank = await signOff(token, ' ');
		expect(blank.status).toBe(400);
		expect(blank.body).toMatchObject({ errors: { name: [expect.any(String)] } });

		const before = Date.now();
		expect((await signOff(token, 'Wren Alder')).status).toBe(200);
		const row = await readInStore(site.store.id, (tx) => completions.read(tx, site.job.id));
		expect(row).toMatchObject({
			signedName: 'Wren Alder',
			signedIp: '198.51.100.23',
			signedUserAgent: 'Porch Tablet 2.0'
		});
		expect(row!.signedAt!.getTime()).toBeGreaterThanOrEqual(before - 1000);
		// Nobody asked for the balance at completion: the sign-off did.
		expect(await balanceMails(site)).toHaveLength(1);

		const again = await signOff(token, 'Someone Else');
		expect(again).toMatchObject({ status: 409 });
		const still = await readInStore(site.store.id, (tx) => completions.read(tx, site.job.id));
		expect(still!.signedName).toBe('Wren Alder');
		expect(await balanceMails(site)).toHaveLength(1);
		expect((await customerLoad(token)).completion).toMatchObject({ signedName: 'Wren Alder' });
	});
});
