import { describe, expect, it } from 'vitest';
import { defaultSettings } from '../settings';
import type { Finding } from '../types';
import { mergeNeeds, type NeedEvent } from './room';
import { contextFor, plankRoom } from './testing';

const finding = (id: string) => ({ id }) as Finding;

describe('roomContext', () => {
	it('reads wood or concrete, the joist spacing and whether new underlayment goes down', () => {
		const plank = contextFor(plankRoom);
		expect(plank.path).toBe('job.rooms.0');
		expect(plank.productPath).toBe('priceBook.floors.1');
		expect(plank.wood).toBe(true);
		// common practice: joists at 16 in o.c. when they were not measured (a store setting)
		expect(plank.spacingIn).toBe(defaultSettings.repairs.defaultJoistSpacingIn);
		// vinyl plank over wood gets new underlayment by the store's setting
		expect(plank.newUnderlayment).toBe(true);
		expect(contextFor({ ...plankRoom, underlayment: false }).newUnderlayment).toBe(false);
		const slab = contextFor({ ...plankRoom, subfloor: { kind: 'concrete' } });
		expect(slab.wood).toBe(false);
		expect(slab.newUnderlayment).toBe(false);
		const joists = { size: '2x10', species: 'hem_fir', spacingIn: 19.2, spanIn: 150 } as const;
		expect(contextFor({ ...plankRoom, joists }).spacingIn).toBe(19.2);
	});
});

describe('mergeNeeds', () => {
	it('adds up readings (low spots, missing tests) and counts whole-room fixes once', () => {
		const a = finding('a');
		const b = finding('b');
		const events: NeedEvent[] = [
			{ kind: 'level', measures: { sqft: 10, each: 1, room: 1 }, findings: [a] },
			{ kind: 'moisture_barrier', measures: { sqft: 120, room: 1 }, findings: [a] },
			{ kind: 'level', measures: { sqft: 6, each: 1, room: 1 }, findings: [b] },
			{ kind: 'moisture_barrier', measures: { sqft: 120, room: 1 }, findings: [b, a] }
		];
		const needs = mergeNeeds(events);
		expect(needs.map((n) => n.kind)).toEqual(['level', 'moisture_barrier']);
		// 10 + 6 ft² to level, two low spots, one room
		expect(needs[0].measures).toEqual({ sqft: 16, each: 2, room: 1 });
		expect(needs[0].findings).toEqual([a, b]);
		// one barrier over the room, whichever check asked for it
		expect(needs[1].measures).toEqual({ sqft: 120, room: 1 });
		expect(needs[1].findings).toEqual([a, b]);
	});

	it('never changes an event it was given', () => {
		const first = { sqft: 10, each: 1, room: 1 };
		const merged = mergeNeeds([
			{ kind: 'grind', measures: first, findings: [] },
			{ kind: 'grind', measures: { each: 1, room: 1 }, findings: [] }
		]);
		expect(first).toEqual({ sqft: 10, each: 1, room: 1 });
		expect(merged[0].measures).toEqual({ sqft: 10, each: 2, room: 1 });
	});
});
