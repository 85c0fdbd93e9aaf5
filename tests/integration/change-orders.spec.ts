// Change orders from the installer's report to the customer's card: priced from the store's book
// (sold against found, a worked example by hand), reviewed on the desk (adjusted, sent with its
// e-mail as a task, or declined with a reason), approved once by the customer through the link,
// paid once through the same Checkout path as the deposit (a session for another amount is a
// mismatch, never a payment), and the installer's phone sees the decision and their pay only.
import { changeOrder as priceChangeOrder } from '$lib/estimating';
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import { customerLink } from '$lib/server/customer-page';
import { changeOrderFromReport } from '$lib/server/change-orders/from-report';
import { installerDecisions } from '$lib/server/change-orders/installer';
import * as changeOrders from '$lib/server/db/queries/change-orders';
import * as payments from '$lib/server/db/queries/payments';
import { fieldItem, payment } from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { startCheckout } from '$lib/server/payments/checkout';
import { handleEvent } from '$lib/server/payments/webhook';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import { isActionFailure, isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { eventsFor as eventsForIn } from './card-jobs';
import {
	CUSTOMER_EMAIL,
	jobOnSite,
	PHOTO_BYTES,
	recordFound,
	recordPhoto,
	soldOf,
	type OnSite
} from './change-order-jobs';
import { addMember, memberEvent, TEST_ORIGIN, type Member } from './factories';

let current: RequestEvent | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));

const deskPage = await import('../../src/routes/app/jobs/[id]/change-orders/[number]/+page.server');
const deskPhoto =
	await import('../../src/routes/app/jobs/[id]/change-orders/[number]/photos/[photo]/+server');
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
const UNDERLAYMENT = { type: 'prep', kind: 'underlayment' } as const;
const PANEL = { type: 'supply', kind: 'underlayment_panel' } as const;

/** One more hole, 40 ft² more underlayment and 2 more panels than the quote sold. */
async function foundMore(site: OnSite) {
	const hole = soldOf(site, HOLE);
	const under = soldOf(site, UNDERLAYMENT);
	const panel = soldOf(site, PANEL);
	return recordFound(site, [
		{ ref: HOLE, qty: hole.qty + 1, unit: 'each', roomId: hole.roomId },
		{ ref: UNDERLAYMENT, qty: under.qty + 40, unit: 'sqft', roomId: under.roomId },
		{ ref: PANEL, qty: panel.qty + 2, unit: 'panel', roomId: panel.roomId }
	]);
}

const fromReport = (site: OnSite) =>
	inStore(site.store.id, (tx) => changeOrderFromReport(tx, site.report.id, site.installer.id));

/** The status an answer or a thrown `error()`/`redirect()` carries. */
async function statusOf(run: () => unknown): Promise<{ status: number; body?: unknown }> {
	try {
		const answer = await run();
		if (answer instanceof Response) return { status: answer.status };
		if (isActionFailure(answer)) return { status: answer.status, body: answer.data };
		return { status: 200, body: answer };
	} catch (e) {
		if (isHttpError(e)) return { status: e.status };
		if (isRedirect(e)) return { status: e.status, body: e.location };
		throw e;
	}
}

const manager = async (site: OnSite): Promise<Member> => ({
	user: await addMember(site.store.id, 'manager', 'A manager'),
	role: 'manager',
	store: site.store
});

function deskAction(
	who: Member,
	site: OnSite,
	name: 'adjust' | 'send' | 'decline',
	fields: Record<string, string>,
	number = '1'
) {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) form.append(k, v);
	const path = `/app/jobs/${site.job.id}/change-orders/${number}?/${name}`;
	current = memberEvent(
		who,
		path,
		{ id: site.job.id, number },
		{ method: 'POST', body: form, headers: { origin: TEST_ORIGIN } }
	);
	const action = deskPage.actions[name] as (e: RequestEvent) => unknown;
	return statusOf(() => action(current!));
}

const tokenOf = async (site: OnSite) =>
	(await readInStore(site.store.id, (tx) => customerLink(tx, site.job.id))).split('/c/')[1];

function customerEvent(token: string, action: string, fields: Record<string, string> = {}) {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) form.append(k, v);
	const url = new URL(`${TEST_ORIGIN}/c/${token}?/${action}`);
	return {
		url,
		params: { token },
		request: new Request(url, {
			method: 'POST',
			body: form,
			headers: { 'user-agent': 'Test Browser 1.0', origin: TEST_ORIGIN }
		}),
		getClientAddress: () => '203.0.113.7',
		setHeaders: () => {}
	} as unknown as RequestEvent;
}

const customerAction = (token: string, name: string, fields: Record<string, string>) => {
	const action = customerPage.actions[name] as (e: RequestEvent) => unknown;
	return statusOf(() => action(customerEvent(token, name, fields)));
};

async function customerLoad(token: string) {
	const url = new URL(`${TEST_ORIGIN}/c/${token}`);
	return (await customerPage.load({
		params: { token },
		url,
		setHeaders: () => {}
	} as unknown as Parameters<typeof customerPage.load>[0])) as Exclude<
		Awaited<ReturnType<typeof customerPage.load>>,
		void
	>;
}

describe('a change order from the installer’s report', () => {
	it('prices found against sold from the store’s book, with the installer’s own pay', async () => {
		const site = await jobOnSite('Priced Floors');
		await foundMore(site);
		const made = await fromReport(site);
		expect(made.ok && made.outcome).toBe('created');
		const co = made.ok ? made.changeOrder! : undefined;
		expect(co).toMatchObject({ status: 'submitted', number: 1, currency: 'USD' });

		// By hand, from the sample price book (src/lib/estimating/sample.ts):
		//   hole repair     +1 each  × $85.00   = +$85.00; pay: the installer's own rate $55.00
		//                                                   (the book's $50.00 is replaced)
		//   underlayment    +40 ft²  × $1.25    = +$50.00; pay 40 × $0.80 = +$32.00
		//   plywood panels  +2       × $32.00   = +$64.00; supplies carry no pay
		//   subtotal $199.00; tax 6.5 % on material only: 6.5 % × $64.00 = $4.16
		//   total $203.16; installer pay +$87.00
		const byKey = Object.fromEntries(co!.result.lines.map((l) => [l.key, l]));
		expect(byKey['prep:hole_repair']).toMatchObject({ deltaQty: 1, deltaCents: 8_500 });
		expect(byKey['prep:hole_repair'].payDeltaCents).toBe(5_500);
		expect(byKey['prep:underlayment']).toMatchObject({ deltaQty: 40, deltaCents: 5_000 });
		expect(byKey['prep:underlayment'].payDeltaCents).toBe(3_200);
		expect(byKey['supply:underlayment_panel']).toMatchObject({ deltaQty: 2, deltaCents: 6_400 });
		expect(byKey['supply:underlayment_panel'].payDeltaCents).toBe(0);
		expect(co!.result.lines).toHaveLength(3);
		expect(co).toMatchObject({
			subtotalCents: 19_900,
			taxCents: 416,
			totalCents: 20_316,
			payDeltaCents: 8_700
		});
		// The input is stored whole: the engine gives the same figures from it again.
		expect(priceChangeOrder(co!.input)).toEqual(co!.result);
	});

	it('sent again updates the open one; when nothing differs, it is removed', async () => {
		const site = await jobOnSite('Resent Floors');
		const items = await foundMore(site);
		const first = await fromReport(site);
		const second = await fromReport(site);
		expect(second.ok && second.outcome).toBe('updated');
		expect(second.ok && second.changeOrder!.id).toBe(first.ok && first.changeOrder!.id);
		const list = await readInStore(site.store.id, (tx) => changeOrders.listForJob(tx, site.job.id));
		expect(list).toHaveLength(1);

		// The installer takes every found item back: what was found is what was sold.
		await inStore(site.store.id, (tx) =>
			tx
				.update(fieldItem)
				.set({ deletedAt: new Date() })
				.where(
					and(eq(fieldItem.organizationId, site.store.id), eq(fieldItem.reportId, site.report.id))
				)
		);
		const removed = await fromReport(site);
		expect(removed.ok && removed.outcome).toBe('removed');
		expect(
			await readInStore(site.store.id, (tx) => changeOrders.listForJob(tx, site.job.id))
		).toHaveLength(0);
		expect(items).toHaveLength(3);
	});
});

describe('the manager’s review', () => {
	it('adjusts, refuses a decline without a reason, and sends it with its e-mail queued', async () => {
		const site = await jobOnSite('Reviewed Floors');
		await foundMore(site);
		await fromReport(site);
		const who = await manager(site);

		const adjusted = await deskAction(who, site, 'adjust', {
			'adjustments.0.description': 'Goodwill: the hole by the door',
			'adjustments.0.amount': '-10.00',
			'adjustments.0.pay': '',
			'adjustments.1.description': '',
			'adjustments.1.amount': ''
		});
		expect(adjusted.status).toBe(200);
		let co = await readInStore(site.store.id, (tx) =>
			changeOrders.readByNumber(tx, site.job.id, 1)
		);
		// $199.00 − $10.00 = $189.00; an adjustment is taxed as prep, which this store does not tax.
		expect(co).toMatchObject({ subtotalCents: 18_900, taxCents: 416, totalCents: 19_316 });
		expect(co!.adjustments).toEqual([
			{ description: 'Goodwill: the hole by the door', amountCents: -1_000, payCents: 0 }
		]);

		const badAmount = await deskAction(who, site, 'adjust', {
			'adjustments.0.description': 'Extra trim',
			'adjustments.0.amount': '0,5'
		});
		expect(badAmount.status).toBe(400);
		expect(badAmount.body).toMatchObject({
			values: { 'adjustments.0.amount': '0,5' },
			errors: { 'adjustments.0.amount': [expect.any(String)] }
		});

		const noReason = await deskAction(who, site, 'decline', { reason: '  ' });
		expect(noReason.status).toBe(400);
		expect(noReason.body).toMatchObject({ errors: { reason: [expect.any(String)] } });

		const sent = await deskAction(who, site, 'send', { to: CUSTOMER_EMAIL });
		expect(sent.status).toBe(200);
		co = await readInStore(site.store.id, (tx) => changeOrders.readByNumber(tx, site.job.id, 1));
		expect(co).toMatchObject({
			status: 'reviewed',
			sentTo: CUSTOMER_EMAIL,
			reviewedBy: who.user.id
		});
		expect(
			await readInStore(site.store.id, (tx) =>
				changeOrders.mailQueued(tx, site.job.id, 'change-order')
			)
		).toBe(true);

		// Sent, its figures are fixed: no more adjustments, no second send.
		const late = await deskAction(who, site, 'adjust', {
			'adjustments.0.description': 'Later',
			'adjustments.0.amount': '5'
		});
		expect(late.status).toBe(409);
		expect((await deskAction(who, site, 'send', { to: CUSTOMER_EMAIL })).status).toBe(409);
	});

	it('declines with a reason', async () => {
		const site = await jobOnSite('Declined Desk Floors');
		await foundMore(site);
		await fromReport(site);
		const who = await manager(site);
		const declined = await deskAction(who, site, 'decline', { reason: 'Already in the quote' });
		expect(declined.status).toBe(200);
		const co = await readInStore(site.store.id, (tx) =>
			changeOrders.readByNumber(tx, site.job.id, 1)
		);
		expect(co).toMatchObject({
			status: 'declined',
			declineReason: 'Already in the quote',
			declinedBy: who.user.id
		});
	});

	it('of another store’s change order, or its photo, is 404; an installer may not review', async () => {
		const site = await jobOnSite('Own Floors');
		const [hole] = await foundMore(site);
		await fromReport(site);
		const photo = await recordPhoto(site, hole);
		const other = await jobOnSite('Other Floors');
		const stranger = await manager(other);

		current = memberEvent(stranger, `/app/jobs/${site.job.id}/change-orders/1`, {
			id: site.job.id,
			number: '1'
		});
		const load = () => deskPage.load(current as Parameters<typeof deskPage.load>[0]);
		expect((await statusOf(load)).status).toBe(404);
		const send = await deskAction(stranger, site, 'send', { to: CUSTOMER_EMAIL });
		expect(send.status).toBe(404);
		current = memberEvent(stranger, `/app/jobs/${site.job.id}/change-orders/1/photos/${photo.id}`, {
			id: site.job.id,
			number: '1',
			photo: photo.id
		});
		expect(
			(await statusOf(() => deskPhoto.GET(current as Parameters<typeof deskPhoto.GET>[0]))).status
		).toBe(404);
		// Their own job's address with this store's photo id: still 404.
		current = memberEvent(
			stranger,
			`/app/jobs/${other.job.id}/change-orders/1/photos/${photo.id}`,
			{ id: other.job.id, number: '1', photo: photo.id }
		);
		expect(
			(await statusOf(() => deskPhoto.GET(current as Parameters<typeof deskPhoto.GET>[0]))).status
		).toBe(404);

		const installer: Member = { user: site.installer, role: 'installer', store: site.store };
		current = memberEvent(installer, `/app/jobs/${site.job.id}/change-orders/1`, {
			id: site.job.id,
			number: '1'
		});
		expect((await statusOf(load)).status).toBe(403);

		// The store's own manager sees it, with the photo beside its line.
		const own = await manager(site);
		current = memberEvent(own, `/app/jobs/${site.job.id}/change-orders/1`, {
			id: site.job.id,
			number: '1'
		});
		const page = (await deskPage.load(current as Parameters<typeof deskPage.load>[0])) as {
			photos: { id: string; lineKey: string | null }[];
			changeOrder: { totalCents: number; payDeltaCents: number | null };
		};
		expect(page.photos).toEqual([
			expect.objectContaining({ id: photo.id, lineKey: `${hole.roomId ?? 'job'}|prep:hole_repair` })
		]);
		expect(page.changeOrder).toMatchObject({ totalCents: 20_316, payDeltaCents: 8_700 });
		current = memberEvent(own, `/app/jobs/${site.job.id}/change-orders/1/photos/${photo.id}`, {
			id: site.job.id,
			number: '1',
			photo: photo.id
		});
		const served = await deskPhoto.GET(current as Parameters<typeof deskPhoto.GET>[0]);
		expect(served.status).toBe(200);
	});
});

/** A job whose change order the manager sent to the customer. */
async function sentToCustomer(name: string) {
	const site = await jobOnSite(name);
	const [hole] = await foundMore(site);
	const photo = await recordPhoto(site, hole);
	await fromReport(site);
	const who = await manager(site);
	expect((await deskAction(who, site, 'send', { to: CUSTOMER_EMAIL })).status).toBe(200);
	const co = (await readInStore(site.store.id, (tx) =>
		changeOrders.readByNumber(tx, site.job.id, 1)
	))!;
	return { site, co, photo, token: await tokenOf(site) };
}

describe('the customer’s answer', () => {
	it('shows the change order and its photos without the installer’s pay, and approves once', async () => {
		const { site, co, photo, token } = await sentToCustomer('Approving Floors');
		const page = await customerLoad(token);
		expect(page.changeOrders).toHaveLength(1);
		expect(page.changeOrders[0]).toMatchObject({
			id: co.id,
			totalCents: 20_316,
			status: 'reviewed'
		});
		expect(page.changePhotos.map((p: { id: string }) => p.id)).toEqual([photo.id]);
		const shown = JSON.stringify(page.changeOrders);
		expect(shown).not.toMatch(/payDelta|payCents|cost|margin/i);
		for (const pay of ['8700', '5500']) expect(shown).not.toContain(pay);

		const bad = await customerAction(token, 'approveChange', { changeOrderId: co.id, name: ' ' });
		expect(bad.status).toBe(400);
		const ok = await customerAction(token, 'approveChange', {
			changeOrderId: co.id,
			name: 'Hester Quill'
		});
		expect(ok.status).toBe(200);
		const again = await customerAction(token, 'approveChange', {
			changeOrderId: co.id,
			name: 'Hester Quill'
		});
		expect(again.status).toBe(409);
		const decline = await customerAction(token, 'declineChange', { changeOrderId: co.id });
		expect(decline.status).toBe(409);
		const row = await readInStore(site.store.id, (tx) => changeOrders.read(tx, co.id));
		expect(row).toMatchObject({
			status: 'approved',
			decidedName: 'Hester Quill',
			decidedIp: '203.0.113.7',
			decidedUserAgent: 'Test Browser 1.0'
		});
		// The manager who sent it is told.
		expect(
			await readInStore(site.store.id, (tx) =>
				changeOrders.mailQueued(tx, site.job.id, 'change-order-answer')
			)
		).toBe(true);
		// Approved, it is owed: the balance grows by its total.
		const money = await readInStore(site.store.id, (tx) => payments.moneyFor(tx, site.job.id));
		expect(money.ledger.owedCents).toBe(site.quote.totalCents + 20_316);
	});

	it('declines with an optional reason', async () => {
		const { site, co, token } = await sentToCustomer('Declining Floors');
		const no = await customerAction(token, 'declineChange', {
			changeOrderId: co.id,
			reason: 'We will leave the old underlayment'
		});
		expect(no.status).toBe(200);
		const row = await readInStore(site.store.id, (tx) => changeOrders.read(tx, co.id));
		expect(row).toMatchObject({
			status: 'declined',
			declineReason: 'We will leave the old underlayment',
			declinedBy: null
		});
		const money = await readInStore(site.store.id, (tx) => payments.moneyFor(tx, site.job.id));
		expect(money.ledger.owedCents).toBe(site.quote.totalCents);
	});

	it('serves only the photos of its own job’s report, and none before a change order is sent', async () => {
		const site = await jobOnSite('Photo Link Floors');
		const [hole] = await foundMore(site);
		const photo = await recordPhoto(site, hole);
		await fromReport(site);
		const token = await tokenOf(site);
		const get = (photoId: string, tok = token) =>
			statusOf(() =>
				customerPhoto.GET({
					params: { token: tok, photo: photoId },
					url: new URL(`${TEST_ORIGIN}/c/${tok}/photos/${photoId}`),
					setHeaders: () => {}
				} as unknown as Parameters<typeof customerPhoto.GET>[0])
			);
		// Still in review: the customer is shown nothing of the report.
		expect((await get(photo.id)).status).toBe(404);
		expect((await customerLoad(token)).changePhotos).toEqual([]);

		const other = await sentToCustomer('Other Photo Floors');
		// Another job's link asking for this job's photo.
		expect((await get(photo.id, other.token)).status).toBe(404);
		// Its own link, once the change order is sent: the photo and its thumbnail.
		const who = await manager(site);
		expect((await deskAction(who, site, 'send', { to: CUSTOMER_EMAIL })).status).toBe(200);
		expect((await get(photo.id)).status).toBe(200);
		const answer = await customerPhoto.GET({
			params: { token, photo: photo.id },
			url: new URL(`${TEST_ORIGIN}/c/${token}/photos/${photo.id}?size=thumb`),
			setHeaders: () => {}
		} as unknown as Parameters<typeof customerPhoto.GET>[0]);
		expect(answer.headers.get('content-type')).toBe('image/jpeg');
		expect(new Uint8Array(await answer.arrayBuffer())).toEqual(
			new Uint8Array(PHOTO_BYTES.subarray(0, 4))
		);
	});
});

describe('a report sent after a change order went to the customer', () => {
	it('leaves it as sent, and after approval prices only what is new (CO-2)', async () => {
		const { site, co, token } = await sentToCustomer('Second Extra Floors');
		expect(await fromReport(site)).toEqual({ ok: false, reason: 'with_customer' });
		await customerAction(token, 'approveChange', { changeOrderId: co.id, name: 'Ivo Marsh' });
		// Nothing new found since: no second change order.
		expect(await fromReport(site)).toMatchObject({ ok: true, outcome: 'unchanged' });

		// One more hole again (the report holds the whole amount found: sold + 2).
		const hole = soldOf(site, HOLE);
		await inStore(site.store.id, (tx) =>
			tx
				.update(fieldItem)
				.set({ qty: hole.qty + 2, version: 2 })
				.where(
					and(
						eq(fieldItem.organizationId, site.store.id),
						eq(fieldItem.reportId, site.report.id),
						eq(fieldItem.refKey, 'prep:hole_repair')
					)
				)
		);
		const second = await fromReport(site);
		expect(second.ok && second.outcome).toBe('created');
		const co2 = second.ok ? second.changeOrder! : undefined;
		// Only the second hole: $85.00, the installer's $55.00; CO-1's items are not billed again.
		expect(co2).toMatchObject({ number: 2, subtotalCents: 8_500, taxCents: 0, totalCents: 8_500 });
		expect(co2!.payDeltaCents).toBe(5_500);
		expect(co2!.result.lines.map((l) => l.key)).toEqual(['prep:hole_repair']);
	});
});

describe('paying a change order', () => {
	it('goes through Checkout for exactly its total, once', async () => {
		const { site, co, token } = await sentToCustomer('Paying Floors');
		expect(
			(await customerAction(token, 'approveChange', { changeOrderId: co.id, name: 'Ivo Marsh' }))
				.status
		).toBe(200);
		const since = Math.floor(Date.now() / 1000) - 1;
		const started = await startCheckout(
			{
				storeId: site.store.id,
				jobId: site.job.id,
				purpose: 'change_order',
				changeOrderId: co.id,
				linkToken: token
			},
			t.stripe
		);
		expect(started.ok).toBe(true);
		const session = /\/dev\/checkout\/(cs_[\w]+)/.exec(started.ok ? started.url : '')![1];
		const retrieved = await t.stripe.checkout.sessions.retrieve(session, undefined, {
			stripeAccount: site.account
		});
		expect(retrieved.amount_total).toBe(20_316);
		expect((await t.fake.pay(session, 'success')).outcome).toBe('paid');
		for (const e of eventsForIn(t, site.account, since)) await handleEvent(e, t.stripe);

		const paid = await readInStore(site.store.id, (tx) => changeOrders.paymentsOf(tx, co.id));
		expect(paid).toHaveLength(1);
		expect(paid[0]).toMatchObject({
			status: 'succeeded',
			purpose: 'change_order',
			amountCents: 20_316
		});
		const again = await startCheckout(
			{
				storeId: site.store.id,
				jobId: site.job.id,
				purpose: 'change_order',
				changeOrderId: co.id,
				linkToken: token
			},
			t.stripe
		);
		expect(again).toMatchObject({ ok: false, reason: 'nothing_due' });
		const page = await customerLoad(token);
		expect(page.changeOrders[0]).toMatchObject({ paid: true, payable: false });
	});

	it('refuses a paid session for another amount, and a payment row of another amount', async () => {
		const { site, co, token } = await sentToCustomer('Mismatch Floors');
		await customerAction(token, 'approveChange', { changeOrderId: co.id, name: 'Ivo Marsh' });
		const started = await startCheckout(
			{
				storeId: site.store.id,
				jobId: site.job.id,
				purpose: 'change_order',
				changeOrderId: co.id,
				linkToken: token
			},
			t.stripe
		);
		expect(started.ok).toBe(true);
		const [pending] = await readInStore(site.store.id, (tx) => changeOrders.paymentsOf(tx, co.id));
		const since = Math.floor(Date.now() / 1000) - 1;
		const cheap = await t.stripe.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'x' } },
						quantity: 1
					}
				],
				success_url: 'http://127.0.0.1/ok',
				cancel_url: 'http://127.0.0.1/no',
				metadata: { store_id: site.store.id, payment_id: pending.id, job_id: site.job.id },
				payment_intent_data: { metadata: { store_id: site.store.id, payment_id: pending.id } }
			},
			{ stripeAccount: site.account }
		);
		expect((await t.fake.pay(cheap.id, 'success')).outcome).toBe('paid');
		for (const e of eventsForIn(t, site.account, since)) await handleEvent(e, t.stripe);
		const [after] = await readInStore(site.store.id, (tx) => changeOrders.paymentsOf(tx, co.id));
		expect(after.status).toBe('pending');
		expect(after.mismatch).toMatch(/paid 100 USD/);

		// The database holds a change order's payment to its total, whoever writes it.
		await expect(
			inStore(site.store.id, (tx) =>
				tx.insert(payment).values({
					organizationId: site.store.id,
					jobId: site.job.id,
					changeOrderId: co.id,
					purpose: 'change_order',
					method: 'cash',
					status: 'failed',
					currency: 'USD',
					amountCents: 20_000
				})
			)
		).rejects.toMatchObject({ cause: { code: '23514' } });
	});

	it('is refused before the customer approves it', async () => {
		const { site, co, token } = await sentToCustomer('Unapproved Floors');
		const pay = await customerAction(token, 'pay', {
			purpose: 'change_order',
			changeOrderId: co.id
		});
		expect(pay.status).toBe(409);
		expect(
			await readInStore(site.store.id, (tx) => changeOrders.paymentsOf(tx, co.id))
		).toHaveLength(0);
	});
});

describe('the installer’s phone', () => {
	it('sees the decision and their own pay difference, never a price', async () => {
		const { site, co, token } = await sentToCustomer('Installer View Floors');
		await customerAction(token, 'approveChange', { changeOrderId: co.id, name: 'Ivo Marsh' });
		const seen = await readInStore(site.store.id, (tx) => installerDecisions(tx, site.job.id));
		expect(seen).toEqual([
			{ number: 1, status: 'approved', payDeltaCents: 8_700, currency: 'USD' }
		]);
		const text = JSON.stringify(seen);
		for (const price of ['20316', '19900', '416', 'total', 'subtotal', 'tax'])
			expect(text).not.toContain(price);
	});
});
