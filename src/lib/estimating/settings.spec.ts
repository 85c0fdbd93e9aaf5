import { describe, expect, it } from 'vitest';
import { defaultSettings as s } from './settings';

describe('default store settings carry TRADE.md values', () => {
	it('underlayment: 4 × 8 ft panels (APA product literature, published), APA E30V Table 14 schedules (published)', () => {
		expect([s.underlayment.panelWidthIn, s.underlayment.panelLengthIn]).toEqual([48, 96]);
		expect(s.underlayment.schedules.apa_quarter_in).toMatchObject({
			edgeSpacingIn: 3,
			fieldSpacingIn: 6,
			edgeDistanceIn: 3 / 8
		});
		expect(s.underlayment.schedules.apa_11_32_in).toMatchObject({
			edgeSpacingIn: 6,
			fieldSpacingIn: 8
		});
		expect(s.underlayment.schedules.apa_over_half_in).toMatchObject({
			edgeSpacingIn: 6,
			fieldSpacingIn: 12
		});
		// common practice: staples 2 in edges, about 6 in grid
		expect(s.underlayment.schedules.staples).toMatchObject({ edgeSpacingIn: 2, fieldSpacingIn: 6 });
	});

	it('joists: NDS Supplement design values (secondary), CF (secondary), Cr 1.15 (memory), dressed sizes (published)', () => {
		expect(s.joists.lumber.douglas_fir_larch).toMatchObject({ ePsi: 1_600_000 });
		expect(s.joists.lumber.douglas_fir_larch.fbPsi['2x10']).toBe(900);
		expect(s.joists.lumber.spruce_pine_fir).toMatchObject({ ePsi: 1_400_000 });
		expect(s.joists.lumber.hem_fir.fbPsi['2x8']).toBe(850);
		expect(s.joists.lumber.southern_pine.fbPsi).toMatchObject({
			'2x8': 925,
			'2x10': 800,
			'2x12': 750
		});
		expect(s.joists.cf).toEqual({ '2x6': 1.3, '2x8': 1.2, '2x10': 1.1, '2x12': 1.0 });
		expect(s.joists.cr).toBe(1.15);
		expect(s.joists.depthIn).toEqual({ '2x6': 5.5, '2x8': 7.25, '2x10': 9.25, '2x12': 11.25 });
		// IRC Tables R301.5 and R502.3.1(2) (published): 40 psf live, 10 psf dead; IRC Table R301.7: L/360
		expect([s.joists.livePsf, s.joists.deadPsf, s.joists.defaultRatio]).toEqual([40, 10, 360]);
	});

	it('moisture and flatness limits (secondary / published as TRADE.md marks them)', () => {
		// ASTM F710 / ASTM F2170 (secondary): 75 % RH; ASTM F1869 (secondary): 3 lb
		expect([s.moisture.rhLimitPct, s.moisture.mverLimit]).toEqual([75, 3]);
		// NWFA installation guidelines (published, via Hardwood Floors 2017)
		expect([
			s.moisture.woodSubfloorMaxPct,
			s.moisture.woodDiffStripPct,
			s.moisture.woodDiffWidePct,
			s.moisture.wideFromIn
		]).toEqual([12, 4, 2, 3]);
		// ANSI A108.02 (secondary, via CTEF): large format from 15 in
		expect(s.flatness.largeTileEdgeIn).toBe(15);
	});

	it('repairs: 1 in hole threshold and 1/2 in rough cut (common practice)', () => {
		expect(s.repairs.ignoreHoleUnderIn).toBe(1);
		expect(s.repairs.roughCutAllowanceIn).toBe(0.5);
		expect(s.repairs.holeMethod).toMatchObject({
			ceramic_tile: 'blocking',
			hardwood: 'backing',
			vinyl_plank: 'blocking_underlayment'
		});
	});
});
