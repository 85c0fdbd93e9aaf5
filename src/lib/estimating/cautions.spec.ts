import { describe, expect, it } from 'vitest';
import { CAUTION_KINDS, CAUTIONS, cautionTexts } from './cautions';

describe('cautions (TRADE.md "Cautions to show")', () => {
	it('says what TRADE.md asks for', () => {
		expect(CAUTIONS.planning_aid).toContain(
			'flooring maker’s instructions and local building codes'
		);
		expect(CAUTIONS.structure).toContain('licensed professional');
		expect(CAUTIONS.structure).toContain('permit');
		expect(CAUTIONS.asbestos).toContain('asbestos');
		expect(CAUTIONS.asbestos).toContain('tested before tear-out');
		expect(CAUTIONS.moisture).toContain('maker’s limits');
		expect(CAUTIONS.dust_tools).toMatch(/eye, ear and lung protection/);
	});

	it('gives texts in a stable order whatever order they were raised', () => {
		expect(cautionTexts(['structure', 'planning_aid'])).toEqual([
			CAUTIONS.planning_aid,
			CAUTIONS.structure
		]);
		expect(cautionTexts([])).toEqual([]);
		expect(CAUTION_KINDS).toHaveLength(Object.keys(CAUTIONS).length);
	});
});
