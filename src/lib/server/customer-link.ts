import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * The customer's link `/c/<token>`: no account, a signed and expiring token naming the store
 * and the job. Nothing is stored; the signature (HMAC-SHA256 with a key derived from the
 * server's secret) proves we made it, and the expiry is inside what is signed.
 */
export interface LinkClaims {
	storeId: string;
	jobId: string;
	expiresAt: Date;
	/**
	 * The job's link version when the link was made (`job.link_version`); staff revoking the link
	 * raise the job's, and older links then stop working. Links made before versions carry none: 1.
	 */
	version?: number;
}

export type LinkCheck =
	({ ok: true } & LinkClaims) | { ok: false; reason: 'malformed' | 'forged' | 'expired' };

function key(secret: string) {
	return createHmac('sha256', secret).update('flushline customer link v1').digest();
}

function mac(payload: string, secret: string) {
	return createHmac('sha256', key(secret)).update(payload).digest('base64url');
}

export function signLink(claims: LinkClaims, secret: string): string {
	const payload = Buffer.from(
		JSON.stringify({
			s: claims.storeId,
			j: claims.jobId,
			e: Math.floor(claims.expiresAt.getTime() / 1000),
			v: claims.version ?? 1
		})
	).toString('base64url');
	return `${payload}.${mac(payload, secret)}`;
}

export function verifyLink(token: string, secret: string, now = new Date()): LinkCheck {
	const [payload, signature, extra] = token.split('.');
	if (!payload || !signature || extra !== undefined || token.length > 512) {
		return { ok: false, reason: 'malformed' };
	}
	const expected = Buffer.from(mac(payload, secret));
	const given = Buffer.from(signature);
	if (expected.length !== given.length || !timingSafeEqual(expected, given)) {
		return { ok: false, reason: 'forged' };
	}
	let claims: { s?: unknown; j?: unknown; e?: unknown; v?: unknown };
	try {
		claims = JSON.parse(Buffer.from(payload, 'base64url').toString('utf8'));
	} catch {
		return { ok: false, reason: 'malformed' };
	}
	if (
		typeof claims.s !== 'string' ||
		typeof claims.j !== 'string' ||
		typeof claims.e !== 'number' ||
		(claims.v !== undefined && !(Number.isSafeInteger(claims.v) && (claims.v as number) >= 1))
	) {
		return { ok: false, reason: 'malformed' };
	}
	const expiresAt = new Date(claims.e * 1000);
	if (expiresAt <= now) return { ok: false, reason: 'expired' };
	const version = (claims.v as number | undefined) ?? 1;
	return { ok: true, storeId: claims.s, jobId: claims.j, expiresAt, version };
}
