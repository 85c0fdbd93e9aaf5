import { env } from '$env/dynamic/private';
import path from 'node:path';

/**
 * The server's settings, read once from the environment (README, "Environment"). ORIGIN is the
 * one setting for the served origin: adapter-node's CSRF check and better-auth's baseURL both
 * use it, so `localhost` and `127.0.0.1` never disagree.
 */
export const config = {
	origin: (env.ORIGIN ?? `http://${env.HOST ?? '127.0.0.1'}:${env.PORT ?? '3000'}`).replace(
		/\/$/,
		''
	),
	authSecret: env.BETTER_AUTH_SECRET ?? '',
	resendApiKey: env.RESEND_API_KEY ?? '',
	mailFrom: env.MAIL_FROM ?? 'Flushline <desk@flushline.local>',
	dataDir: path.resolve(env.FLUSHLINE_DATA_DIR ?? '.data/app'),
	/** The Resend fake answers while no real key is set. */
	get fakeMail() {
		return !this.resendApiKey;
	}
};

/** Stops start-up with a clear message when a required setting is missing. */
export function checkConfig() {
	const missing = ['DATABASE_URL', 'BETTER_AUTH_SECRET'].filter((k) => !env[k]);
	if (missing.length) {
		throw new Error(
			`Missing environment variables: ${missing.join(', ')} (see README, "Environment")`
		);
	}
	if (config.authSecret.length < 32) {
		throw new Error('BETTER_AUTH_SECRET must be at least 32 characters');
	}
}
