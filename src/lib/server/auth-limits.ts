import { createHash } from 'node:crypto';
import type pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';

/**
 * Limits on the ways into an account: sign-in, sign-up, password reset (asking and setting) and
 * accepting an invitation. Each attempt counts against the client address (all kinds together)
 * and against the account it names (per kind: an e-mail, a reset token, an invitation), in the
 * `auth_limit` table, so every server shares the counts. A successful sign-in clears its account's
 * count, so only failures add up there. Framework-free: better-auth's hooks call it
 * (create-auth.ts), for its HTTP routes and our form actions alike.
 */

export type AttemptKind = 'sign-in' | 'sign-up' | 'reset' | 'invite' | 'password';

export interface LimitSettings {
	/** Attempts one account may take per window, per kind. */
	perAccount: number;
	/** Attempts one client address may take per window, all kinds together. */
	perAddress: number;
	windowSeconds: number;
}

export const DEFAULT_LIMITS: LimitSettings = { perAccount: 10, perAddress: 50, windowSeconds: 900 };

/** Whole numbers from 1 to `max`, or the default; a bad value stops start-up (config.ts). */
export function readLimitSettings(env: Record<string, string | undefined>): LimitSettings {
	const read = (key: string, fallback: number, max: number) => {
		const raw = env[key];
		if (raw === undefined || raw === '') return fallback;
		const n = Number(raw);
		if (!Number.isInteger(n) || n < 1 || n > max) {
			throw new Error(`${key} must be a whole number from 1 to ${max} (got "${raw}")`);
		}
		return n;
	};
	return {
		perAccount: read('FLUSHLINE_AUTH_LIMIT_ACCOUNT', DEFAULT_LIMITS.perAccount, 1_000_000),
		perAddress: read('FLUSHLINE_AUTH_LIMIT_ADDRESS', DEFAULT_LIMITS.perAddress, 1_000_000),
		windowSeconds: read('FLUSHLINE_AUTH_LIMIT_WINDOW', DEFAULT_LIMITS.windowSeconds, 86_400)
	};
}

export type AttemptAnswer = { ok: true } | { ok: false; retryAfterSeconds: number };

export interface AuthLimits {
	attempt(kind: AttemptKind, who: { account?: string; address?: string }): Promise<AttemptAnswer>;
	succeeded(kind: AttemptKind, account: string): Promise<void>;
}

const digest = (text: string) =>
	createHash('sha256').update(text.trim().toLowerCase()).digest('base64url').slice(0, 32);

/** The limits stored in PostgreSQL through the app's pool (the table comes from a migration). */
export function createAuthLimits(pool: pg.Pool, settings: LimitSettings): AuthLimits {
	const common = {
		storeClient: pool,
		storeType: 'pool',
		tableName: 'auth_limit',
		tableCreated: true,
		duration: settings.windowSeconds
	};
	const byAddress = new RateLimiterPostgres({
		...common,
		keyPrefix: 'address',
		points: settings.perAddress
	});
	const byAccount = new RateLimiterPostgres({
		...common,
		keyPrefix: 'account',
		points: settings.perAccount
	});
	const accountKey = (kind: AttemptKind, account: string) => `${kind}:${digest(account)}`;

	return {
		async attempt(kind, { account, address }) {
			try {
				if (address) await byAddress.consume(digest(address));
				if (account) await byAccount.consume(accountKey(kind, account));
				return { ok: true };
			} catch (e) {
				if (e instanceof RateLimiterRes) {
					return { ok: false, retryAfterSeconds: Math.max(1, Math.ceil(e.msBeforeNext / 1000)) };
				}
				throw e;
			}
		},
		async succeeded(kind, account) {
			await byAccount.delete(accountKey(kind, account));
		}
	};
}

/** "Wait 14 minutes" in words a person reads. */
export function waitText(seconds: number): string {
	if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
	const minutes = Math.ceil(seconds / 60);
	return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}
