import { describe, expect, it } from 'vitest';
import { roomOutline, roomShape, type Point, type Shape, type Cutout } from '$lib/estimating';
import { corners, edgeLabels, isAxisRectangle } from './edges';

/** The engine's outline of a room, as the drawings get it. */
function outlineOf(shape: Shape, cutouts: Cutout[] = []) {
	const made = roomShape(shape, cutouts);
	if (!made.ok) throw new Error(made.message);
	return roomOutline(made);
}

const feet = (labels: { lengthIn: number }[]) => labels.map((l) => l.lengthIn / 12);

describe('the walls a drawing labels', () => {
	it('labels all six legs of a 12 × 10 ft room with a 4 × 3 ft corner notch', () => {
		// Worked example: 12 ft wide (x), 10 ft long (y); the notch takes x 8–12 ft, y 7–10 ft.
		// Walking round: bottom 12; right side 10 − 3 = 7; notch floor 4; notch side 3;
		// top 12 − 4 = 8; left side 10. 12 + 7 + 4 + 3 + 8 + 10 = 44 ft = 2 × (12 + 10).
		const outline = outlineOf({ kind: 'rect', widthIn: 144, lengthIn: 120 }, [
			{ name: 'Notch', shape: { kind: 'rect', xIn: 96, yIn: 84, widthIn: 48, lengthIn: 36 } }
		]);
		const labels = edgeLabels(outline.outer);
		expect(labels).toHaveLength(6);
		expect([...feet(labels)].sort((a, b) => a - b)).toEqual([3, 4, 7, 8, 10, 12]);
		// In order round the room, whichever corner and direction the engine starts with.
		const seq = feet(labels);
		const fromTwelve = (list: number[]) => {
			const at = list.indexOf(12);
			return [...list.slice(at), ...list.slice(0, at)];
		};
		const walked = [fromTwelve(seq), fromTwelve([...seq].reverse())];
		expect(walked.some((w) => w.join() === '12,7,4,3,8,10' || w.join() === '12,10,8,3,4,7')).toBe(
			true
		);
		expect(seq.reduce((s, n) => s + n, 0)).toBe(44);
	});

	it('sets each label outside its wall: the notch legs point into the notch', () => {
		const outline = outlineOf({ kind: 'rect', widthIn: 144, lengthIn: 120 }, [
			{ name: 'Notch', shape: { kind: 'rect', xIn: 96, yIn: 84, widthIn: 48, lengthIn: 36 } }
		]);
		const byMid = (x: number, y: number) =>
			edgeLabels(outline.outer).find((l) => l.mid[0] === x && l.mid[1] === y);
		// The notch's floor (y = 84 in, x 96–144) faces up (+y, into the notch).
		expect(byMid(120, 84)?.out).toEqual([0, 1]);
		// The notch's side (x = 96 in, y 84–120) faces right (+x, into the notch).
		expect(byMid(96, 102)?.out).toEqual([1, 0]);
		// The bottom wall faces down, the left wall left.
		expect(byMid(72, 0)?.out).toEqual([0, -1]);
		expect(byMid(0, 60)?.out).toEqual([-1, 0]);
		// Vertical walls read turned a quarter; level walls read level.
		expect(byMid(0, 60)?.angle).toBe(-90);
		expect(byMid(96, 102)?.angle).toBe(-90);
		expect(byMid(72, 0)?.angle).toBe(0);
	});

	it('labels an L made of two rectangles the same way, whatever the ring’s direction', () => {
		// A 10 × 4 ft hall with a 4 × 6 ft arm on its left end (x 0–4 ft, y 4–10 ft):
		// (0,0)→(120,0) 10 ft; →(120,48) 4; →(48,48) 6; →(48,120) 6; →(0,120) 4; →(0,0) 10.
		const ring: Point[] = [
			[0, 0],
			[120, 0],
			[120, 48],
			[48, 48],
			[48, 120],
			[0, 120]
		];
		expect(feet(edgeLabels(ring))).toEqual([10, 4, 6, 6, 4, 10]);
		const clockwise = [...ring].reverse();
		const cw = edgeLabels(clockwise);
		expect(feet(cw).sort()).toEqual([10, 4, 6, 6, 4, 10].sort());
		// Outward stays outward: the bottom wall faces down either way.
		expect(cw.find((l) => l.mid[1] === 0)?.out).toEqual([0, -1]);
	});

	it('gives a plain rectangle two labels, its width on top and its length on the left', () => {
		const outline = outlineOf({ kind: 'rect', widthIn: 144, lengthIn: 120 });
		expect(isAxisRectangle(outline.outer)).toBe(true);
		const labels = edgeLabels(outline.outer);
		expect(labels.map((l) => [l.lengthIn, l.out])).toEqual([
			[144, [0, 1]],
			[120, [-1, 0]]
		]);
	});

	it('drops repeated points and corners in the middle of a straight wall', () => {
		const ring: Point[] = [
			[0, 0],
			[60, 0],
			[60, 0],
			[120, 0],
			[120, 96],
			[0, 96]
		];
		expect(corners(ring)).toEqual([
			[0, 0],
			[120, 0],
			[120, 96],
			[0, 96]
		]);
		expect(feet(edgeLabels(ring))).toEqual([10, 8]);
	});

	it('labels every wall of a room that is not square to the axes, upright', () => {
		// A right triangle 3-4-5 ft: the long wall runs 5 ft at a slope and reads upright.
		const ring: Point[] = [
			[0, 0],
			[48, 0],
			[0, 36]
		];
		const labels = edgeLabels(ring);
		expect(labels.map((l) => Math.round(l.lengthIn))).toEqual([48, 60, 36]);
		for (const l of labels) expect(l.angle).toBeGreaterThanOrEqual(-90);
		for (const l of labels) expect(l.angle).toBeLessThan(90);
		// The sloping wall rises to the left on paper: on screen that is a clockwise turn.
		expect(labels[1].angle).toBeCloseTo((Math.atan2(36, 48) * 180) / Math.PI, 6);
	});
});
