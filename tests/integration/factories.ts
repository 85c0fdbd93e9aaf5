// Typed factories for integration tests: real rows through the real auth and query modules.
import { createAuth } from '$lib/server/create-auth';
import { db } from '$lib/server/db';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import type { Mail } from '$lib/server/mail/templates';
import type { Role } from '$lib/server/permissions';

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
	return customers.create(storeId, { name, email: null, phone: null, notes: '' });
}

export async function makeJob(storeId: string, actorId: string, customerId?: string) {
	const customerRow = customerId ?? (await makeCustomer(storeId)).id;
	const job = await jobs.create(
		storeId,
		{ customerId: customerRow, title: unique('job') },
		actorId
	);
	if (!job) throw new Error('job not created');
	return job;
}
