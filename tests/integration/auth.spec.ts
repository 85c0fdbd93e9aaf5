// Sign-up, invitations and password reset through better-auth with our options, against the
// real database; e-mail through the Resend SDK and the msw fake.
import { pool } from '$lib/server/db';
import { authFailure } from '$lib/server/auth-errors';
import { createMailer } from '$lib/server/mail/send';
import { invitationMail } from '$lib/server/mail/templates';
import { readMembership } from '$lib/server/db/queries/stores';
import { resendHandlers } from '$mocks/resend';
import { readOutbox, linksOf } from '$mocks/outbox';
import { setupServer } from 'msw/node';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	addMember,
	auth,
	makeStore,
	makeUser,
	sentMail,
	sessionOf,
	TEST_ORIGIN,
	TEST_PASSWORD,
	unique
} from './factories';

async function users() {
	const { rows } = await pool.query<{ n: number }>('select count(*)::int as n from "user"');
	return rows[0].n;
}

async function failureOf(work: Promise<unknown>) {
	try {
		await work;
	} catch (e) {
		return authFailure(e);
	}
	throw new Error('expected a refusal');
}

describe('sign-up refusals', () => {
	it('refuses a weak password and writes nothing', async () => {
		const before = await users();
		const failure = await failureOf(
			auth.api.signUpEmail({
				body: { name: 'Weak', email: `${unique('w')}@test.example`, password: 'short1' }
			})
		);
		expect(failure).toMatchObject({ field: 'password', message: 'Use at least 10 characters' });
		expect(await users()).toBe(before);
	});

	it('refuses an invalid e-mail and writes nothing', async () => {
		const before = await users();
		const failure = await failureOf(
			auth.api.signUpEmail({
				body: { name: 'Bad', email: 'not-an-address', password: TEST_PASSWORD }
			})
		);
		expect(failure.field).toBe('email');
		expect(await users()).toBe(before);
	});

	it('refuses a second account for the same e-mail', async () => {
		const user = await makeUser();
		const failure = await failureOf(
			auth.api.signUpEmail({ body: { name: 'Again', email: user.email, password: TEST_PASSWORD } })
		);
		expect(failure).toMatchObject({
			field: 'email',
			message: expect.stringMatching(/already exists/)
		});
	});
});

describe('invitations', () => {
	it('sends the invitation from the store, accepts it once, and gives the invited role', async () => {
		const store = await makeStore('Invite Floors');
		const owner = await sessionOf(store.owner.email);
		const email = `${unique('new')}@test.example`;
		const invitation = await auth.api.createInvitation({
			headers: owner,
			body: { email, role: 'sales', organizationId: store.id }
		});
		const mail = sentMail.at(-1)!;
		expect(mail).toMatchObject({ to: email, fromName: 'Invite Floors' });
		expect(mail.html).toContain(`${TEST_ORIGIN}/invite/${invitation.id}`);
		expect(mail.text).toContain('as Sales');

		const invitee = await auth.api.signUpEmail({
			body: { name: 'New Seller', email, password: TEST_PASSWORD }
		});
		const headers = await sessionOf(email);
		await auth.api.acceptInvitation({ headers, body: { invitationId: invitation.id } });
		expect((await readMembership(invitee.user.id, store.id))?.role).toBe('sales');
		const again = await failureOf(
			auth.api.acceptInvitation({ headers, body: { invitationId: invitation.id } })
		);
		expect(again.message).toMatch(/expired, was cancelled or was already used/);
	});

	it('refuses a duplicate invitation and keeps one row', async () => {
		const store = await makeStore('Duplicate Floors');
		const owner = await sessionOf(store.owner.email);
		const email = `${unique('dup')}@test.example`;
		await auth.api.createInvitation({
			headers: owner,
			body: { email, role: 'installer', organizationId: store.id }
		});
		const failure = await failureOf(
			auth.api.createInvitation({
				headers: owner,
				body: { email, role: 'manager', organizationId: store.id }
			})
		);
		expect(failure).toMatchObject({
			field: 'email',
			message: expect.stringMatching(/already has an open invitation/)
		});
		const { rows } = await pool.query('select role from invitation where email = $1', [email]);
		expect(rows).toEqual([{ role: 'installer' }]);
	});

	it('refuses an expired invitation and adds no member', async () => {
		const store = await makeStore('Expiry Floors');
		const owner = await sessionOf(store.owner.email);
		const email = `${unique('late')}@test.example`;
		const invitation = await auth.api.createInvitation({
			headers: owner,
			body: { email, role: 'sales', organizationId: store.id }
		});
		await pool.query(
			`update invitation set expires_at = now() - interval '1 minute' where id = $1`,
			[invitation.id]
		);
		const late = await auth.api.signUpEmail({
			body: { name: 'Late', email, password: TEST_PASSWORD }
		});
		const failure = await failureOf(
			auth.api.acceptInvitation({
				headers: await sessionOf(email),
				body: { invitationId: invitation.id }
			})
		);
		expect(failure.message).toMatch(/expired/);
		expect(await readMembership(late.user.id, store.id)).toBeNull();
	});

	it('refuses an invitation opened by someone it was not sent to', async () => {
		const store = await makeStore('Recipient Floors');
		const invitation = await auth.api.createInvitation({
			headers: await sessionOf(store.owner.email),
			body: { email: `${unique('meant')}@test.example`, role: 'sales', organizationId: store.id }
		});
		const stranger = await makeUser('Stranger');
		const failure = await failureOf(
			auth.api.acceptInvitation({
				headers: await sessionOf(stranger.email),
				body: { invitationId: invitation.id }
			})
		);
		expect(failure.message).toMatch(/sent to another e-mail address/);
		expect(await readMembership(stranger.id, store.id)).toBeNull();
	});

	it('lets only the owner invite', async () => {
		const store = await makeStore('Rights Floors');
		for (const role of ['manager', 'sales', 'installer'] as const) {
			const member = await addMember(store.id, role);
			const failure = await failureOf(
				auth.api.createInvitation({
					headers: await sessionOf(member.email),
					body: { email: `${unique('x')}@test.example`, role: 'sales', organizationId: store.id }
				})
			);
			expect(failure.status, role).toBe(403);
		}
	});

	it('defaults a member added without a role to the least privileged one', async () => {
		const { rows } = await pool.query<{ column_default: string }>(
			`select column_default from information_schema.columns where table_name = 'member' and column_name = 'role'`
		);
		expect(rows[0].column_default).toContain('installer');
	});

	it('lets one login belong to two stores with different roles', async () => {
		const first = await makeStore('First Floors');
		const second = await makeStore('Second Floors');
		const rosa = await addMember(first.id, 'installer', 'Rosa');
		await auth.api.addMember({
			body: { userId: rosa.id, role: 'manager', organizationId: second.id }
		});
		expect((await readMembership(rosa.id, first.id))?.role).toBe('installer');
		expect((await readMembership(rosa.id, second.id))?.role).toBe('manager');
	});
});

describe('password reset', () => {
	it('mails a one-hour link whose token sets a new password, once', async () => {
		const user = await makeUser('Forgetful');
		await auth.api.requestPasswordReset({
			body: { email: user.email, redirectTo: `${TEST_ORIGIN}/reset-password` }
		});
		const mail = sentMail.at(-1)!;
		expect(mail.to).toBe(user.email);
		const token = /reset-password\/([^?"]+)/.exec(mail.html)?.[1];
		expect(token).toBeTruthy();
		await auth.api.resetPassword({ body: { token: token!, newPassword: 'a-new-password-2' } });
		await expect(sessionOf(user.email, 'a-new-password-2')).resolves.toBeInstanceOf(Headers);
		const reused = await failureOf(
			auth.api.resetPassword({ body: { token: token!, newPassword: 'another-one-3' } })
		);
		expect(reused.message).toMatch(/expired or was already used/);
	});

	it('answers the same for an address with no login, and sends nothing', async () => {
		const before = sentMail.length;
		await auth.api.requestPasswordReset({
			body: {
				email: `${unique('nobody')}@test.example`,
				redirectTo: `${TEST_ORIGIN}/reset-password`
			}
		});
		expect(sentMail.length).toBe(before);
	});
});

describe('e-mail through the Resend SDK and the local fake', () => {
	const dir = mkdtempSync(path.join(tmpdir(), 'flushline-outbox-'));
	const server = setupServer(...resendHandlers(dir));
	beforeAll(() => server.listen({ onUnhandledRequest: 'error' }));
	afterAll(() => server.close());

	it('stores the message with its links in the outbox, from the store by name', async () => {
		const send = createMailer({ from: 'Flushline <desk@flushline.local>' });
		const mail = invitationMail({
			to: 'new@test.example',
			storeName: 'Tallow Creek Floors',
			inviterName: 'Mira',
			roleLabel: 'Sales',
			url: `${TEST_ORIGIN}/invite/abc`,
			expiresAt: new Date('2026-12-08T00:00:00Z'),
			timeZone: 'UTC'
		});
		const { id } = await send(mail);
		const [stored] = readOutbox(dir);
		expect(stored).toMatchObject({
			id,
			to: ['new@test.example'],
			from: 'Tallow Creek Floors <desk@flushline.local>',
			subject: 'Mira invited you to Tallow Creek Floors'
		});
		expect(linksOf(stored)).toEqual([`${TEST_ORIGIN}/invite/abc`]);
	});

	it('fails loudly when the service refuses the message', async () => {
		const send = createMailer({ from: 'Flushline <desk@flushline.local>' });
		await expect(
			send({ to: 'x@test.example', subject: '', html: '<p>x</p>', text: 'x' })
		).rejects.toThrow(/subject/);
	});
});
