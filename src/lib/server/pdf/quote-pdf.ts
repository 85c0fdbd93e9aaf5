import fontkit from '@pdf-lib/fontkit';
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { PDFDocument, rgb, type PDFFont, type PDFImage, type PDFPage } from 'pdf-lib';
import { formatLength, type Outline } from '../../estimating';
import { formatDate, formatMoney, formatQty, perUnit } from '../../format';
import type { CustomerQuote } from '../../papers/customer-quote';

/** Everything printed on a quote: the store's details, never ours. */
export interface QuotePdfInput {
	store: {
		name: string;
		/** The store's time zone: the dates printed are the store's days. */
		timeZone: string;
		address: string;
		town: string;
		phone: string;
		email: string;
	};
	logo?: { bytes: Uint8Array; type: 'image/png' | 'image/jpeg' };
	customer: { name: string; email: string | null; phone: string | null };
	site?: { address: string; town: string } | null;
	job: { label: string; title: string };
	version: number;
	status: string;
	issuedAt: Date;
	validUntil: Date | null;
	accepted?: { name: string; at: Date } | null;
	/** The customer's quote (`$lib/papers`): the PDF is a customer paper, whoever downloads it. */
	quote: CustomerQuote;
}

// Letter, in points; the palette's ink, plank and signal.
export const PAGE = { width: 612, height: 792, margin: 48 };
export const INK = rgb(0x26 / 255, 0x32 / 255, 0x3d / 255);
export const MUTED = rgb(0x56 / 255, 0x68 / 255, 0x79 / 255);
const PLANK = rgb(0xa9 / 255, 0x65 / 255, 0x2c / 255);
export const PLANK_LIGHT = rgb(0xf5 / 255, 0xe9 / 255, 0xd7 / 255);
export const SIGNAL = rgb(0xd4 / 255, 0x55 / 255, 0x11 / 255);
const RULE = rgb(0xeb / 255, 0xe6 / 255, 0xdb / 255);

const require = createRequire(import.meta.url);
const fontFile = (weight: number) =>
	require.resolve(`@fontsource/manrope/files/manrope-latin-${weight}-normal.woff`);

let fonts: Promise<[Buffer, Buffer]> | undefined;
export function fontBytes() {
	fonts ??= Promise.all([readFile(fontFile(400)), readFile(fontFile(700))]);
	return fonts;
}

/** Characters the embedded font lacks, spelled in ones it has. */
const SPELLED: Record<string, string> = {
	'⅛': '1/8',
	'¼': '1/4',
	'½': '1/2',
	'¾': '3/4',
	'≥': '>=',
	'≤': '<='
};

export class Writer {
	page!: PDFPage;
	y = 0;
	pages: PDFPage[] = [];
	/** Every piece of text drawn, in order: what the paper says, for tests and checks. */
	readonly drawn: string[] = [];
	private chars: Set<number>;

	constructor(
		private doc: PDFDocument,
		readonly regular: PDFFont,
		readonly bold: PDFFont,
		private footer: string
	) {
		this.chars = new Set([...regular.getCharacterSet()]);
		this.newPage();
	}

	clean(text: string) {
		let out = '';
		for (const ch of text) {
			if (this.chars.has(ch.codePointAt(0)!)) out += ch;
			else out += SPELLED[ch] ?? (ch === '\n' ? ' ' : '?');
		}
		return out;
	}

	newPage() {
		this.page = this.doc.addPage([PAGE.width, PAGE.height]);
		this.pages.push(this.page);
		this.y = PAGE.height - PAGE.margin;
	}

	/** Room for `height` more points, or a new page. */
	need(height: number) {
		if (this.y - height < PAGE.margin + 24) this.newPage();
	}

	width(text: string, size: number, font = this.regular) {
		return font.widthOfTextAtSize(this.clean(text), size);
	}

	text(text: string, x: number, y: number, size: number, font = this.regular, color = INK) {
		const clean = this.clean(text);
		this.drawn.push(clean);
		this.page.drawText(clean, { x, y, size, font, color });
	}

	/** Words wrapped to a width; returns the lines. */
	wrap(text: string, size: number, maxWidth: number, font = this.regular) {
		const lines: string[] = [];
		let line = '';
		for (const word of this.clean(text).split(/\s+/)) {
			const next = line ? `${line} ${word}` : word;
			if (font.widthOfTextAtSize(next, size) > maxWidth && line) {
				lines.push(line);
				line = word;
			} else line = next;
		}
		if (line) lines.push(line);
		return lines;
	}

	paragraph(
		text: string,
		size = 9.5,
		options: { x?: number; width?: number; font?: PDFFont; color?: typeof INK } = {}
	) {
		const x = options.x ?? PAGE.margin;
		const width = options.width ?? PAGE.width - PAGE.margin - x;
		for (const line of this.wrap(text, size, width, options.font)) {
			this.need(size * 1.45);
			this.text(line, x, this.y - size, size, options.font, options.color);
			this.y -= size * 1.45;
		}
	}

	heading(text: string) {
		this.need(40);
		this.y -= 14;
		this.text(text, PAGE.margin, this.y - 13, 13, this.bold);
		this.y -= 22;
	}

	rule() {
		this.page.drawLine({
			start: { x: PAGE.margin, y: this.y },
			end: { x: PAGE.width - PAGE.margin, y: this.y },
			thickness: 0.75,
			color: RULE
		});
	}

	finish() {
		this.pages.forEach((page, i) => {
			const label = this.clean(`${this.footer} · page ${i + 1} of ${this.pages.length}`);
			page.drawText(label, { x: PAGE.margin, y: 28, size: 8, font: this.regular, color: MUTED });
		});
	}
}

/** An outline as an SVG path in a box of `w` × `h` points (y down), to scale. */
export function outlinePath(outline: Outline, w: number, h: number) {
	const { minX, maxY, widthIn, lengthIn } = outline.bbox;
	const scale = Math.min(w / widthIn, h / lengthIn);
	const at = ([x, y]: [number, number]) =>
		`${((x - minX) * scale).toFixed(2)} ${((maxY - y) * scale).toFixed(2)}`;
	const ring = (points: [number, number][]) =>
		points.map((p, i) => `${i ? 'L' : 'M'} ${at(p)}`).join(' ') + ' Z';
	return { d: [outline.outer, ...outline.holes].map(ring).join(' '), scale };
}

/** The quote as a PDF of our own layout, with the store's name, details and logo. */
export async function quotePdf(input: QuotePdfInput): Promise<Uint8Array> {
	return (await drawQuotePdf(input)).bytes;
}

/** The quote's PDF and every piece of text drawn on it. */
export async function drawQuotePdf(
	input: QuotePdfInput
): Promise<{ bytes: Uint8Array; text: string[] }> {
	const doc = await PDFDocument.create();
	doc.registerFontkit(fontkit);
	const [regularBytes, boldBytes] = await fontBytes();
	const regular = await doc.embedFont(regularBytes, { subset: true });
	const bold = await doc.embedFont(boldBytes, { subset: true });
	doc.setTitle(`${input.store.name} quote ${input.job.label} v${input.version}`);
	doc.setAuthor(input.store.name);
	doc.setCreator(input.store.name);
	doc.setProducer(input.store.name);

	const q = input.quote;
	const money = (cents: number) => formatMoney(cents, q.currency);
	const w = new Writer(
		doc,
		regular,
		bold,
		`${input.store.name} · quote ${input.job.label} version ${input.version}`
	);
	const right = PAGE.width - PAGE.margin;

	// Letterhead: logo and the store's details; the quote's number and dates on the right.
	let logo: PDFImage | undefined;
	if (input.logo) {
		logo =
			input.logo.type === 'image/png'
				? await doc.embedPng(input.logo.bytes)
				: await doc.embedJpg(input.logo.bytes);
	}
	let top = w.y;
	if (logo) {
		const s = Math.min(150 / logo.width, 56 / logo.height, 1);
		w.page.drawImage(logo, {
			x: PAGE.margin,
			y: top - logo.height * s,
			width: logo.width * s,
			height: logo.height * s
		});
		top -= logo.height * s + 8;
	}
	w.text(input.store.name, PAGE.margin, top - 18, 18, bold);
	const contact = [
		input.store.address,
		input.store.town,
		input.store.phone,
		input.store.email
	].filter(Boolean);
	contact.forEach((line, i) => w.text(line, PAGE.margin, top - 34 - i * 12, 9.5, regular, MUTED));
	const stamp = [
		['Quote', `${input.job.label} · version ${input.version}`],
		['Issued', formatDate(input.issuedAt, input.store.timeZone, 'long')],
		...(input.validUntil
			? [['Good until', formatDate(input.validUntil, input.store.timeZone, 'long')]]
			: [])
	];
	stamp.forEach(([label, value], i) => {
		const y = w.y - 14 - i * 14;
		w.text(label, right - 200, y, 9.5, regular, MUTED);
		w.text(value, right - w.width(value, 10, bold), y, 10, bold);
	});
	w.y = Math.min(top - 34 - contact.length * 12, w.y - 14 - stamp.length * 14) - 12;
	w.rule();
	w.y -= 18;

	w.text('For', PAGE.margin, w.y - 9.5, 9.5, regular, MUTED);
	w.text(input.customer.name, PAGE.margin + 40, w.y - 10, 11, bold);
	w.y -= 16;
	const siteLine = input.site
		? [input.site.address, input.site.town].filter(Boolean).join(', ')
		: '';
	for (const line of [
		siteLine,
		[input.customer.email, input.customer.phone].filter(Boolean).join(' · ')
	]) {
		if (!line) continue;
		w.text(line, PAGE.margin + 40, w.y - 9.5, 9.5, regular, MUTED);
		w.y -= 13;
	}
	w.text(input.job.title, PAGE.margin + 40, w.y - 10, 10, regular);
	w.y -= 16;

	// Rooms drawn to scale, three to a row.
	w.heading('Rooms');
	const cell = { w: (PAGE.width - 2 * PAGE.margin - 24) / 3, h: 110 };
	q.rooms.forEach((room, i) => {
		const col = i % 3;
		if (col === 0) w.need(cell.h + 60);
		const x = PAGE.margin + col * (cell.w + 12);
		const y = w.y;
		w.text(room.name, x, y - 10, 10, bold);
		const area = q.metric
			? `${(room.areaSqFt * 0.09290304).toFixed(1)} m²`
			: `${Math.round(room.areaSqFt).toLocaleString('en-US')} ft²`;
		w.text(area, x + cell.w - w.width(area, 9), y - 10, 9, regular, MUTED);
		if (room.outline) {
			const { d, scale } = outlinePath(room.outline, cell.w - 8, cell.h - 8);
			const drawnW = room.outline.bbox.widthIn * scale;
			const drawnH = room.outline.bbox.lengthIn * scale;
			w.page.drawSvgPath(d, {
				x: x + (cell.w - drawnW) / 2,
				y: y - 18 - (cell.h - drawnH) / 2,
				color: PLANK_LIGHT,
				borderColor: INK,
				borderWidth: 1.2
			});
			const unit = q.metric ? 'm' : 'ft-in';
			const dims = `${formatLength(room.outline.bbox.widthIn, unit, { denominator: 2 })} × ${formatLength(room.outline.bbox.lengthIn, unit, { denominator: 2 })}`;
			w.text(dims, x, y - cell.h - 24, 8.5, regular, MUTED);
		}
		const under = [
			room.floor ?? 'No new floor',
			...room.takingUp.map((k) => `taking up ${k.toLowerCase()}`)
		];
		w.wrap(under.join('; '), 8.5, cell.w)
			.slice(0, 2)
			.forEach((part, k) => w.text(part, x, y - cell.h - 35 - k * 10, 8.5, regular));
		if (col === 2 || i === q.rooms.length - 1) w.y -= cell.h + 56;
	});

	// Lines by group: the prep in plain sentences, supplies without their sizes.
	const cols = { qty: right - 250, price: right - 150, amount: right };
	for (const group of q.groups) {
		w.heading(group.title);
		for (const line of group.lines) {
			const label = line.room ? `${line.text} (${line.room})` : line.text;
			const priced = line.priced;
			const wrapped = w.wrap(label, 9.5, (priced ? cols.qty - 70 : cols.amount - 80) - PAGE.margin);
			w.need(wrapped.length * 13 + 6);
			const y = w.y - 9.5;
			wrapped.forEach((part, i) => w.text(part, PAGE.margin, y - i * 13, 9.5));
			if (priced) {
				const qty = formatQty(priced.qty, priced.basis);
				const price = `${money(priced.unitCents)} ${perUnit(priced.basis)}`;
				w.text(qty, cols.qty - w.width(qty, 9.5), y, 9.5);
				w.text(price, cols.price + 40 - w.width(price, 9), y, 9, regular, MUTED);
			}
			const amount = money(line.amountCents);
			w.text(amount, cols.amount - w.width(amount, 9.5, bold), y, 9.5, bold);
			w.y -= wrapped.length * 13 + 7;
		}
	}

	// Totals.
	w.need(150);
	w.y -= 12;
	w.rule();
	w.y -= 8;
	const totalRow = (label: string, value: string, strong = false) => {
		const size = strong ? 13 : 10;
		const font = strong ? bold : regular;
		w.text(label, right - 280, w.y - size, size, font);
		w.text(value, right - w.width(value, size, font), w.y - size, size, font);
		w.y -= size + 8;
	};
	for (const group of q.groups) totalRow(group.title, money(q.totals.byGroup[group.key]));
	totalRow('Subtotal', money(q.totals.subtotalCents));
	for (const tax of q.totals.taxes) {
		if (tax.taxCents) totalRow(`${tax.name} (${tax.rateBps / 100} %)`, money(tax.taxCents));
	}
	totalRow('Total', money(q.totals.totalCents), true);
	totalRow('Deposit to book the install', money(q.totals.depositCents));
	totalRow('Balance after the install', money(q.totals.balanceCents));
	if (q.days) {
		w.paragraph(
			`The work takes about ${q.days} working ${q.days === 1 ? 'day' : 'days'}, including getting the floor ready and the time it needs to dry or settle.`,
			9,
			{ color: MUTED }
		);
	}

	// What the homeowner should know before the install, then the store's own papers.
	if (q.cautions.length) {
		w.heading('Before the install');
		for (const c of q.cautions) {
			w.paragraph(c.title, 9.5, { font: bold });
			w.paragraph(c.text, 9, { color: INK });
			w.y -= 4;
		}
	}
	for (const [title, text] of [
		['What happens next', q.papers.nextSteps],
		['Cancellation', q.papers.cancellation],
		['Terms', q.papers.terms]
	]) {
		w.heading(title);
		for (const part of text.split(/\n+/)) if (part.trim()) w.paragraph(part, 9, { color: INK });
	}

	w.need(60);
	w.y -= 14;
	if (input.accepted) {
		w.page.drawRectangle({
			x: PAGE.margin,
			y: w.y - 34,
			width: PAGE.width - 2 * PAGE.margin,
			height: 34,
			color: PLANK_LIGHT
		});
		w.text(
			`Accepted by ${input.accepted.name} on ${formatDate(input.accepted.at, input.store.timeZone, 'long')}.`,
			PAGE.margin + 10,
			w.y - 21,
			10.5,
			bold,
			PLANK
		);
		w.y -= 40;
	} else {
		w.paragraph(
			`To accept this quote, open the link in the e-mail from ${input.store.name} and type your name, or call ${input.store.phone || 'the store'}.`,
			9.5
		);
	}
	w.finish();
	return { bytes: await doc.save(), text: w.drawn };
}
