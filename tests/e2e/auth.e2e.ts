import pg from 'pg';
import { makeStore } from './factories';
import { expect, signInAs, test } from './fixtures';
import { demoEmail, freshEmail, lastMailLink, signIn } from './helpers';

// Sign-up, sign-in and the password reset go through their forms on purpose; a test about
// something else signs in from a session (./fixtures.ts).

test('sign-up shows each problem by its field and keeps what was typed', async ({ page }) => {
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Odile Fenn');
	await page.getByLabel('E-mail').fill('odile-at-example');
	await page.getByLabel('Password').fill('short');
	await page.getByRole('button', { name: 'Create login' }).click();
	await expect(page.getByText('Enter an e-mail address like name@example.com')).toBeVisible();
	await expect(page.getByText('Use at least 10 characters')).toBeVisible();
	await expect(page.getByLabel('Your name')).toHaveValue('Odile Fenn');
	await expect(page.getByLabel('E-mail')).toHaveValue('odile-at-example');
	await expect(page.getByLabel('E-mail')).toHaveAttribute('aria-invalid', 'true');
});

test('a wrong password says so, without saying which part was wrong', async ({ page }) => {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(demoEmail('sales'));
	await page.getByLabel('Password').fill('not-the-password-9');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('That e-mail and password do not match an account.')).toBeVisible();
	await expect(page.getByLabel('E-mail')).toHaveValue(demoEmail('sales'));
});

test('a forgotten password is reset through the e-mailed link', async ({ page }) => {
	const email = freshEmail('forgetful');
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Ned Forgetful');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('first-password-1');
	await page.getByRole('button', { name: 'Create login' }).click();
	await expect(page).toHaveURL(/\/stores$/);
	await page.getByRole('button', { name: 'Sign out' }).click();

	await page.getByRole('link', { name: 'Forgot your password?' }).click();
	// The sign-in page has an E-mail field too: type once the next page is there.
	await expect(page.getByRole('heading', { name: 'Forgot your password?' })).toBeVisible();
	await page.getByLabel('E-mail').fill(email);
	await page.getByRole('button', { name: 'Send the link' }).click();
	await expect(page.getByText(`If ${email} has a login`)).toBeVisible();

	await page.goto(await lastMailLink(page, email));
	await expect(page).toHaveURL(/\/reset-password\?token=/);
	await page.getByLabel('New password').fill('second-password-2');
	await page.getByLabel('The same again').fill('second-password-3');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page.getByText('The two passwords differ')).toBeVisible();
	await page.getByLabel('New password').fill('second-password-2');
	await page.getByLabel('The same again').fill('second-password-2');
	await page.getByRole('button', { name: 'Save the new password' }).click();
	await expect(page.getByText('Your password is changed')).toBeVisible();
	await signIn(page, email, 'second-password-2');
	await expect(page).toHaveURL(/\/stores$/);
});

test('a duplicate invitation is refused by the field; an expired one shows a clear page', async ({
	page,
	context
}) => {
	const email = freshEmail('twice');
	await signInAs(context, (await makeStore()).people[0]);
	await page.goto('/app/team');
	const invite = async () => {
		await page.getByLabel('E-mail').fill(email);
		await page.getByLabel('Role', { exact: true }).selectOption('installer');
		await page.getByRole('button', { name: 'Send the invitation' }).click();
	};
	await invite();
	await expect(page.getByText(`Invitation sent to ${email}`)).toBeVisible();
	await invite();
	await expect(page.getByText('This person already has an open invitation')).toBeVisible();
	await expect(page.getByLabel('E-mail')).toHaveValue(email);

	const link = await lastMailLink(page, email);
	const db = new pg.Client({ connectionString: process.env.DATABASE_OWNER_URL });
	await db.connect();
	await db.query(`update invitation set expires_at = now() - interval '1 day' where email = $1`, [
		email
	]);
	await db.end();
	// Only the invitee, signed in with the address it went to, sees more than the store's name.
	await page.goto(link);
	await expect(page.getByText('this invitation was sent to another address')).toBeVisible();
	await expect(page.getByText('This invitation has expired')).toHaveCount(0);
	await page.getByRole('button', { name: 'Sign out' }).click();
	await page.goto(link);
	await page.getByRole('link', { name: 'Create a login' }).click();
	await page.getByLabel('Your name').fill('Arlo Tamsworth');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('late-invite-77');
	await page.getByRole('button', { name: 'Create login' }).click();
	await expect(page.getByText('This invitation has expired')).toBeVisible();
	await expect(page.getByRole('button', { name: 'Accept and join' })).toHaveCount(0);
});

test('an unknown invitation is a 404 page', async ({ page }) => {
	const response = await page.goto('/invite/not-a-real-invitation');
	expect(response?.status()).toBe(404);
	await expect(page.getByText('This invitation does not exist')).toBeVisible();
});
