import { env } from '$env/dynamic/private';
import path from 'node:path';
import { readLimitSettings } from './auth-limits';

/**
 * The webhook signing secret while the Stripe fake is on: fixed, so the fake and the endpoint
 * agree without setup. It signs nothing outside this machine.
 */
export const LOCAL_STRIPE_WEBHOOK_SECRET = 'whsec_flushline_local_fake_not_a_real_secret';

/**
 * The server's settings, read once from the environment (README, "Environment"). ORIGIN is the
 * one setting for the served origin: adapter-node's CSRF check and better-auth's baseURL both
 * use it, so `localhost` and `127.0.0.1` never disagree.
 */
function isOn(value: string | undefined) {
	return value === '1' || value === 'true';
}

export const config = {
	origin: (env.ORIGIN ?? `http://${env.HOST ?? '127.0.0.1'}:${env.PORT ?? '3000'}`).replace(
		/\/$/,
		''
	),
	authSecret: env.BETTER_AUTH_SECRET ?? '',
	resendApiKey: env.RESEND_API_KEY ?? '',
	mailFrom: env.MAIL_FROM ?? 'Flushline <desk@flushline.local>',
	dataDir: path.resolve(env.FLUSHLINE_DATA_DIR ?? '.data/app'),
	/**
	 * The local fakes are switched on on purpose (`FLUSHLINE_FAKES=1`, which `npm start` and
	 * `npm test` set), never because a key is missing: without it a missing key stops start-up.
	 */
	fakes: isOn(env.FLUSHLINE_FAKES),
	/** The Resend fake answers while the fakes are on and no real key is set. */
	get fakeMail() {
		return this.fakes && !this.resendApiKey;
	},
	stripeSecretKey: env.STRIPE_SECRET_KEY ?? '',
	/** The Stripe fake answers the SDK while the fakes are on and no real secret key is set. */
	get fakeStripe() {
		return this.fakes && !this.stripeSecretKey;
	},
	/** The webhook endpoint's signing secret: the real one, or the fake's fixed local one. */
	get stripeWebhookSecret() {
		return env.STRIPE_WEBHOOK_SECRET || (this.fakeStripe ? LOCAL_STRIPE_WEBHOOK_SECRET : '');
	},
	/** Sign-in, sign-up, reset and invitation limits (`FLUSHLINE_AUTH_LIMIT_*`). */
	get authLimits() {
		return readLimitSettings(env);
	},
	/**
	 * The S3-compatible file store when `FLUSHLINE_STORAGE=s3` (else files stay on local disk):
	 * `S3_BUCKET`, `S3_REGION`, `S3_ENDPOINT` (non-AWS), `S3_FORCE_PATH_STYLE`, `S3_PREFIX`, and
	 * `S3_ACCESS_KEY_ID`/`S3_SECRET_ACCESS_KEY` (or the SDK's own credential chain).
	 */
	get s3() {
		if (env.FLUSHLINE_STORAGE !== 's3') return undefined;
		return {
			bucket: env.S3_BUCKET ?? '',
			region: env.S3_REGION || 'us-east-1',
			endpoint: env.S3_ENDPOINT || undefined,
			forcePathStyle: env.S3_FORCE_PATH_STYLE ? isOn(env.S3_FORCE_PATH_STYLE) : undefined,
			accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
			secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
			prefix: env.S3_PREFIX ?? ''
		};
	},
	/** This server's name behind a load balancer, answered as `X-Served-By` (unset: none). */
	serverName: env.FLUSHLINE_SERVER_NAME || undefined,
	/** Where the Stripe fake delivers its events (the app's own endpoint unless set). */
	get stripeFakeWebhookUrl() {
		return env.STRIPE_FAKE_WEBHOOK_URL || `${this.origin}/api/webhooks/stripe`;
	}
};

/** Stops start-up with a clear message when a required setting is missing. */
export function checkConfig() {
	const missing = ['DATABASE_URL', 'BETTER_AUTH_SECRET'].filter((k) => !env[k]);
	if (env.FLUSHLINE_STORAGE === 's3' && !env.S3_BUCKET) missing.push('S3_BUCKET');
	if (missing.length) {
		throw new Error(
			`Missing environment variables: ${missing.join(', ')} (see README, "Environment")`
		);
	}
	const services = [
		['RESEND_API_KEY', config.resendApiKey, 'e-mail'],
		['STRIPE_SECRET_KEY', config.stripeSecretKey, 'card payments']
	].filter(([, value]) => !config.fakes && !value);
	if (services.length) {
		throw new Error(
			`Missing ${services.map(([key, , what]) => `${key} (${what})`).join(' and ')}. ` +
				'Set the real key, or FLUSHLINE_FAKES=1 to use the local fakes on purpose (README, "Environment")'
		);
	}
	void config.authLimits; // throws on a bad FLUSHLINE_AUTH_LIMIT_* value
	if (config.authSecret.length < 32) {
		throw new Error('BETTER_AUTH_SECRET must be at least 32 characters');
	}
	if (config.stripeSecretKey && !/^(sk|rk)_(test|live)_/.test(config.stripeSecretKey)) {
		throw new Error('STRIPE_SECRET_KEY must be a Stripe secret key (sk_test_…, sk_live_… or rk_…)');
	}
	if (config.stripeSecretKey && !env.STRIPE_WEBHOOK_SECRET) {
		throw new Error(
			'STRIPE_WEBHOOK_SECRET is required with STRIPE_SECRET_KEY: the signing secret of the endpoint /api/webhooks/stripe'
		);
	}
}
