/**
 * Benchmark: a 60-room job of mixed shapes, floors and repairs through the whole engine.
 * Prints the median and p95 time per estimate and the peak heap. Run: npm run bench:estimate (bench/run.js bundles it as the server ships it)
 */
import { getHeapStatistics } from 'node:v8';
import { defaultSettings, estimate, type EstimateInput } from '../src/lib/estimating/index';
import { samplePriceBook, sampleJob } from '../src/lib/estimating/sample';

const ROOMS = 60;
const WARMUP = 300;
const RUNS = 2000;

const input: EstimateInput = {
	job: sampleJob(ROOMS),
	settings: defaultSettings,
	priceBook: samplePriceBook
};

const first = estimate(input);
if (!first.ok) {
	console.error('The bench job has errors:', first.errors);
	process.exit(1);
}

let sink = 0;
for (let i = 0; i < WARMUP; i++) sink += estimate(input).totals.totalCents;

const times: number[] = [];
let peakHeap = process.memoryUsage().heapUsed;
for (let i = 0; i < RUNS; i++) {
	const t0 = performance.now();
	const r = estimate(input);
	times.push(performance.now() - t0);
	sink += r.totals.totalCents;
	if (i % 50 === 0) peakHeap = Math.max(peakHeap, process.memoryUsage().heapUsed);
}
times.sort((a, b) => a - b);
const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))];
const heap = getHeapStatistics();
const mb = (b: number) => (b / 1024 / 1024).toFixed(1);

console.log(
	`estimate(): ${ROOMS} rooms, ${first.lines.length} lines, ${first.findings.length} findings`
);
console.log(`runs ${RUNS} after ${WARMUP} warm-up`);
console.log(
	`median ${at(0.5).toFixed(3)} ms   p95 ${at(0.95).toFixed(3)} ms   max ${times[times.length - 1].toFixed(3)} ms`
);
console.log(
	`peak heap used ${mb(peakHeap)} MB (v8 heap size limit ${mb(heap.heap_size_limit)} MB, total ${mb(heap.total_heap_size)} MB)`
);
// The figure issue 12 asks for: the 60-room job's median under 1 ms.
console.log(
	`issue 12: median ${at(0.5).toFixed(3)} ms for the ${ROOMS}-room job, target under 1 ms: ${at(0.5) < 1 ? 'met' : 'NOT met'}`
);
if (sink === 0) console.log('(no total)');
