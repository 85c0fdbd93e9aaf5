import { config } from '../config';
import { createMailer } from './send';

/** The app's mailer: Resend with a real key, the local fake in `mocks/` without one. */
export const mailer = createMailer({ apiKey: config.resendApiKey, from: config.mailFrom });
export type { Mail } from './templates';
