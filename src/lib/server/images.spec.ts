import { describe, expect, it } from 'vitest';
import {
	IMAGE_CONCURRENCY,
	IMAGE_WAITING_LIMIT,
	imageWork,
	ImagesBusy,
	imagesBusy
} from './images';

describe('imageWork', () => {
	it('runs at most IMAGE_CONCURRENCY at once and every piece of work once', async () => {
		let running = 0;
		let most = 0;
		const done: number[] = [];
		await Promise.all(
			Array.from({ length: 10 }, (_, i) =>
				imageWork(async () => {
					running++;
					most = Math.max(most, running);
					await new Promise((r) => setTimeout(r, 5));
					running--;
					done.push(i);
				})
			)
		);
		expect(most).toBe(IMAGE_CONCURRENCY);
		expect(done.sort((a, b) => a - b)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
	});

	it('passes a failure to its caller and keeps the queue going', async () => {
		await expect(imageWork(() => Promise.reject(new Error('broken image')))).rejects.toThrow(
			'broken image'
		);
		await expect(imageWork(async () => 'next')).resolves.toBe('next');
	});

	it('refuses new work while IMAGE_WAITING_LIMIT images wait, and takes it again after', async () => {
		let release!: () => void;
		const gate = new Promise<void>((r) => (release = r));
		let ran = 0;
		const held = Array.from({ length: IMAGE_CONCURRENCY + IMAGE_WAITING_LIMIT }, () =>
			imageWork(async () => {
				ran++;
				await gate;
			})
		);
		expect(imagesBusy()).toBe(true);
		let refusedRan = false;
		await expect(
			imageWork(async () => {
				refusedRan = true;
			})
		).rejects.toBeInstanceOf(ImagesBusy);
		release();
		await Promise.all(held);
		expect(ran).toBe(IMAGE_CONCURRENCY + IMAGE_WAITING_LIMIT);
		expect(refusedRan).toBe(false);
		expect(imagesBusy()).toBe(false);
		await expect(imageWork(async () => 'after')).resolves.toBe('after');
	});
});
