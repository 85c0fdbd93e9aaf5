import fontkit from '@pdf-lib/fontkit';
import { PDFDocument } from 'pdf-lib';
import { formatLength } from '../../estimating';
import { formatQty } from '../../format';
import type { WorkOrder } from '../field/work-order';
import { fontBytes, INK, MUTED, outlinePath, PAGE, PLANK_LIGHT, SIGNAL, Writer } from './quote-pdf';

/**
 * The work order as a PDF of one or two sheets for the installer: where, who, the rooms to scale,
 * the floor, materials, prep in the order it is done, the readings to take, cautions. No price.
 */
export async function workOrderPdf(order: WorkOrder, storeName: string): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	doc.registerFontkit(fontkit);
	const [regularBytes, boldBytes] = await fontBytes();
	const regular = await doc.embedFont(regularBytes, { subset: true });
	const bold = await doc.embedFont(boldBytes, { subset: true });
	doc.setTitle(`${storeName} work order ${order.job.label}`);
	doc.setAuthor(storeName);
	doc.setCreator(storeName);
	doc.setProducer(storeName);
	const w = new Writer(doc, regular, bold, `${storeName} · work order ${order.job.label}`);

	w.text(`Work order ${order.job.label}`, PAGE.margin, w.y - 18, 18, bold);
	w.y -= 26;
	w.text(`${order.job.title} · ${storeName}`, PAGE.margin, w.y - 10, 10, regular, MUTED);
	w.y -= 22;
	const lines: [string, string][] = [
		['Customer', [order.customer.name, order.customer.phone].filter(Boolean).join(' · ')]
	];
	if (order.site) {
		lines.push([
			'Site',
			[order.site.address, order.site.town, order.site.postcode].filter(Boolean).join(', ')
		]);
		if (order.site.access) lines.push(['Access', order.site.access]);
	}
	if (order.booking) {
		const days = `${order.booking.startsOn}${order.booking.days > 1 ? ` to ${order.booking.endsOn}` : ''}`;
		lines.push([
			'Days',
			`${days}${order.booking.arrivesAt ? `, arrive ${order.booking.arrivesAt.slice(0, 5)}` : ''}`
		]);
		if (order.booking.notes) lines.push(['From the store', order.booking.notes]);
	}
	if (order.job.notes) lines.push(['Job notes', order.job.notes]);
	if (order.builtYear) lines.push(['House built', String(order.builtYear)]);
	for (const [label, value] of lines) {
		w.need(14);
		w.text(label, PAGE.margin, w.y - 9.5, 9.5, regular, MUTED);
		w.paragraph(value, 9.5, { x: PAGE.margin + 90 });
		w.y -= 2;
	}

	if (order.rooms.length) {
		w.heading('Rooms');
		const cell = { w: (PAGE.width - 2 * PAGE.margin - 24) / 3, h: 100 };
		order.rooms.forEach((room, i) => {
			const col = i % 3;
			if (col === 0) w.need(cell.h + 60);
			const x = PAGE.margin + col * (cell.w + 12);
			const y = w.y;
			w.text(room.name, x, y - 10, 10, bold);
			const area = `${Math.round(room.areaSqFt)} ft²`;
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
				const dims = `${formatLength(room.outline.bbox.widthIn)} × ${formatLength(room.outline.bbox.lengthIn)}`;
				w.text(dims, x, y - cell.h - 24, 8.5, regular, MUTED);
			}
			const floor = room.floor ? `${room.floor.name}, ${room.floor.layout}` : 'No new floor';
			w.text(floor, x, y - cell.h - 35, 8.5, regular);
			if (col === 2 || i === order.rooms.length - 1) w.y -= cell.h + 44;
		});
	}

	if (order.materials.length) {
		w.heading('Materials');
		for (const m of order.materials) {
			const qty = formatQty(m.qty, m.basis);
			w.need(13);
			w.text(qty, PAGE.width - PAGE.margin - w.width(qty, 9.5, bold), w.y - 9.5, 9.5, bold);
			w.paragraph(m.roomName ? `${m.description} (${m.roomName})` : m.description, 9.5, {
				width: PAGE.width - 2 * PAGE.margin - 110
			});
		}
	}

	if (order.steps.length) {
		w.heading('Order of work');
		order.steps.forEach((step, i) => {
			const cure = step.cureHours ? `, then wait ${step.cureHours} h` : '';
			w.paragraph(
				`${i + 1}. ${step.label}${step.hours ? ` (about ${step.hours} h${cure})` : ''}`,
				10,
				{
					font: bold
				}
			);
			for (const l of step.lines) {
				const qty = formatQty(l.qty, l.basis);
				w.paragraph(
					`${qty}${l.roomName ? ` · ${l.roomName}` : ''}: ${l.method || l.description}`,
					9,
					{
						x: PAGE.margin + 14
					}
				);
			}
			w.y -= 3;
		});
	}

	if (order.readings.length) {
		w.heading('Readings before install');
		for (const r of order.readings) {
			w.paragraph(`${r.roomName}: ${r.what} Limit: ${r.rule} (${r.source}).`, 9, {
				color: r.pass ? INK : SIGNAL
			});
		}
	}

	if (order.structure.length) {
		w.heading('Structure and subfloor checks');
		for (const r of order.structure) {
			w.paragraph(`${r.roomName}: ${r.what} (${r.source}).`, 9, {
				color: r.pass ? INK : SIGNAL
			});
		}
	}

	w.heading('Cautions');
	for (const c of order.cautions) w.paragraph(`• ${c}`, 8.5, { color: MUTED });

	w.finish();
	return doc.save();
}
