// The setup project: runs once before the browser tests (and before a single file run alone).
// It empties the test database and seeds the demo stores, then saves a signed-in session for
// each demo login (support/auth.ts), made through better-auth's API rather than the form, and
// checks that the server takes each one.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { resetDatabase, seedDemo } from '../../scripts/seed';
import { expect, requestAs, test as setup } from './fixtures';
import {
	DEMO_LOGINS,
	DEMO_PASSWORD,
	demoStatePath,
	newSession,
	type DemoLogin
} from './support/auth';

setup(
	'the demo stores, seeded afresh, and a saved sign-in for each demo login',
	async ({ playwright }) => {
		const ownerUrl = process.env.DATABASE_OWNER_URL;
		if (!ownerUrl) throw new Error('Run the browser tests through `npm test` (see DEVELOPERS.md)');
		await resetDatabase(ownerUrl);
		await seedDemo();
		for (const [login, email] of Object.entries(DEMO_LOGINS) as [DemoLogin, string][]) {
			const file = demoStatePath(login);
			mkdirSync(path.dirname(file), { recursive: true });
			writeFileSync(file, JSON.stringify(await newSession({ email, password: DEMO_PASSWORD })));
			const api = await requestAs(playwright, login);
			const me = await api.get('/api/v1/me');
			expect(me.status(), login).toBe(200);
			expect((await me.json()).user.email).toBe(email);
			await api.dispose();
		}
	}
);
