import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { linksOf, readOutbox, recordMessage } from './outbox';

describe('outbox', () => {
	it('keeps messages newest first, across reads', () => {
		const dir = mkdtempSync(path.join(tmpdir(), 'outbox-'));
		const base = { from: 'a', to: ['b'], html: '', text: '', replyTo: null };
		recordMessage(dir, { ...base, id: '1', at: '2026-01-01T00:00:00Z', subject: 'first' });
		recordMessage(dir, { ...base, id: '2', at: '2026-01-02T00:00:00Z', subject: 'second' });
		expect(readOutbox(dir).map((m) => m.subject)).toEqual(['second', 'first']);
	});

	it('finds each link once, with entities decoded', () => {
		const html =
			'<a href="http://x/a?b=1&amp;c=2">A</a> <a href="http://x/a?b=1&amp;c=2">again</a>';
		expect(linksOf({ html })).toEqual(['http://x/a?b=1&c=2']);
	});
});
