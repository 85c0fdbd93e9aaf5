// A steady request rate, from a process of its own (`steady()` in bench/http.ts starts it).
//
// One request every 1000/rate ms by the clock, whatever the answers do: each request is due at
// start + i × interval, and its latency is counted from when it was due, not from when it left,
// so a late send (this process or the machine busy) counts against the figure rather than
// hiding (coordinated omission). A request goes on a free keep-alive connection, or a new one if
// every connection is waiting for an answer. This process does nothing else, so no other work of
// the bench's (its autocannon runs, their timers and histograms) sits between a response and the
// moment it is timed; and requests never bunch up the way per-connection timers drift together.
//
// Input (standard input, JSON): { url, method, headers, body (base64), rate, seconds, fresh, signWith }.
// `fresh`: a 36-character placeholder in the body, replaced by a new UUID in each request (a
// photo's client id, a webhook's event id); `signWith`: a webhook secret, to sign each body as
// Stripe does (`t=…,v1=HMAC-SHA256(secret, "t.body")`). Output (stdout, JSON):
// { times: [ms…] for 2xx answers, other: how many were not 2xx or failed, kinds: those by status
// or error code ({ "503": 2, "ECONNRESET": 1 }), late: sends over 2 ms behind their time }.
import { createHmac, randomUUID } from 'node:crypto';
import http from 'node:http';

let text = '';
for await (const chunk of process.stdin) text += chunk;
const input = JSON.parse(text);
const { url, method = 'GET', headers = {}, rate, seconds, fresh, signWith } = input;
const template = input.body === undefined ? undefined : Buffer.from(input.body, 'base64');
const marks = [];
if (template && fresh) {
	if (fresh.length !== 36) throw new Error('steady: the placeholder is as long as a UUID');
	for (let at = template.indexOf(fresh); at >= 0; at = template.indexOf(fresh, at + 36)) {
		marks.push(at);
	}
}
/** The request's body and its own headers: the template with fresh ids, signed if asked. */
function next() {
	if (!template) return { body: undefined, extra: {} };
	let body = template;
	if (marks.length) {
		body = Buffer.from(template);
		const id = Buffer.from(randomUUID());
		for (const at of marks) id.copy(body, at);
	}
	const extra = { 'content-length': String(body.length) };
	if (signWith) {
		const t = Math.floor(Date.now() / 1000);
		const v1 = createHmac('sha256', signWith).update(`${t}.`).update(body).digest('hex');
		extra['stripe-signature'] = `t=${t},v1=${v1}`;
	}
	return { body, extra };
}
if (!(rate > 0 && rate <= 1000 && seconds > 0 && seconds <= 600)) {
	console.error('steady: rate 1–1000 and seconds 1–600');
	process.exit(2);
}
const target = new URL(url);
const agent = new http.Agent({ keepAlive: true, maxSockets: 1000 });
const gap = 1000 / rate;
const total = Math.round(rate * seconds);
const times = [];
let other = 0;
/** The answers that were not 2xx, by status, and the failures, by error code. */
const kinds = new Map();
const count = (kind) => {
	other++;
	kinds.set(kind, (kinds.get(kind) ?? 0) + 1);
};
let late = 0;
let sent = 0;
let finished = 0;

const start = performance.now() + 50;
await new Promise((done) => {
	const settle = () => {
		if (++finished === total) done();
	};
	const tick = () => {
		while (sent < total && performance.now() >= start + sent * gap) {
			const due = start + sent * gap;
			sent++;
			if (performance.now() - due > 2) late++;
			const { body, extra } = next();
			const req = http.request(
				{
					host: target.hostname,
					port: target.port,
					path: target.pathname + target.search,
					method,
					agent,
					headers: { ...headers, ...extra }
				},
				(res) => {
					res.resume();
					res.on('end', () => {
						if (res.statusCode >= 200 && res.statusCode < 300) times.push(performance.now() - due);
						else count(String(res.statusCode));
						settle();
					});
				}
			);
			req.on('error', (e) => {
				count(e.code ?? 'error');
				settle();
			});
			req.end(body);
		}
		if (sent < total) setTimeout(tick, Math.max(0, start + sent * gap - performance.now()));
	};
	setTimeout(tick, 50);
});
agent.destroy();
process.stdout.write(JSON.stringify({ times, other, kinds: Object.fromEntries(kinds), late }));
