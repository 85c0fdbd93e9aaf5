// Only for better-auth's schema generator (see DEVELOPERS.md): the auth options without a database.
import { drizzle } from 'drizzle-orm/node-postgres';
import { createAuth } from '../src/lib/server/create-auth';

export const auth = createAuth({
	db: drizzle.mock(),
	baseURL: 'http://127.0.0.1:3000',
	secret: 'schema-generation-only-secret-not-used',
	sendMail: async () => ({ id: '' })
});
