import { jobLabel } from '$lib/jobs/status';
import { formatDay, addDays } from '$lib/schedule/days';
import { escapeHtml, type Mail } from '../mail/templates';
import { bookingCalendar } from './calendar';

export type BookingChange = 'booked' | 'moved' | 'cancelled';

export interface BookingMailFacts {
	booking: {
		id: string;
		version: number;
		startsOn: string;
		days: number;
		arrivesAt: string | null;
		notes: string;
	};
	job: { id: string; number: number; title: string };
	customerName: string;
	address: string;
	storeName: string;
}

function dates(b: BookingMailFacts['booking']): string {
	const first = formatDay(b.startsOn, 'long');
	if (b.days === 1) return first;
	return `${first} to ${formatDay(addDays(b.startsOn, b.days - 1), 'long')} (${b.days} days)`;
}

const arrival = (b: BookingMailFacts['booking']) =>
	b.arrivesAt ? `Arrival each day at about ${b.arrivesAt.slice(0, 5)}.` : '';

function html(heading: string, paragraphs: string[], footer: string): string {
	return `<!doctype html><html><body style="margin:0;background:#faf8f4;font-family:Manrope,Segoe UI,Helvetica,Arial,sans-serif;color:#26323d">
<div style="max-width:560px;margin:0 auto;padding:32px 24px">
<h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(heading)}</h1>
${paragraphs.map((p) => `<p style="font-size:16px;line-height:1.55;margin:0 0 14px">${escapeHtml(p)}</p>`).join('\n')}
<p style="font-size:13px;color:#566879;margin:24px 0 0">${escapeHtml(footer)}</p>
</div></body></html>`;
}

function mail(
	to: string,
	storeName: string,
	subject: string,
	heading: string,
	paragraphs: string[],
	calendar: string
): Mail {
	const footer = 'The calendar file attached adds these days to your calendar, or updates them.';
	const body = paragraphs.filter(Boolean);
	return {
		to,
		fromName: storeName,
		subject,
		html: html(heading, body, footer),
		text: [heading, '', ...body, '', footer].join('\n'),
		attachments: [{ filename: 'install.ics', contentType: 'text/calendar', content: calendar }]
	};
}

/** The calendar file for the booking as it now stands (cancelled when `change` says so). */
export function calendarFor(
	f: BookingMailFacts,
	change: BookingChange,
	who: 'installer' | 'customer'
) {
	const label = jobLabel(f.job.number);
	return bookingCalendar({
		id: f.booking.id,
		version: f.booking.version,
		startsOn: f.booking.startsOn,
		days: f.booking.days,
		cancelled: change === 'cancelled',
		title:
			who === 'installer'
				? `${label} ${f.job.title} — ${f.customerName}`
				: `Floor install — ${f.storeName}`,
		description:
			who === 'installer'
				? [f.booking.notes, arrival(f.booking)].filter(Boolean).join('\n')
				: arrival(f.booking),
		location: f.address,
		storeName: f.storeName
	});
}

/** The installer's e-mail: the job, the days, the site, the notes; never a price. */
export function installerBookingMail(
	to: string,
	f: BookingMailFacts,
	change: BookingChange,
	fieldUrl: string | null
): Mail {
	const label = `${jobLabel(f.job.number)} ${f.job.title}`;
	const subject =
		change === 'booked'
			? `Booked: ${label}`
			: change === 'moved'
				? `New dates: ${label}`
				: `Cancelled: ${label}`;
	const paragraphs =
		change === 'cancelled'
			? [
					`${f.storeName} has taken you off ${label} for ${f.customerName}.`,
					`It was: ${dates(f.booking)}.`
				]
			: [
					`${f.storeName} has booked you for ${label} at ${f.customerName}’s.`,
					`Days: ${dates(f.booking)}.`,
					arrival(f.booking),
					f.address ? `Site: ${f.address}.` : '',
					f.booking.notes ? `Notes: ${f.booking.notes}` : '',
					fieldUrl ? `The job on your phone: ${fieldUrl}` : ''
				];
	return mail(to, f.storeName, subject, subject, paragraphs, calendarFor(f, change, 'installer'));
}

/** The customer's e-mail: the install days and arrival, nothing of the installer's pay. */
export function customerBookingMail(to: string, f: BookingMailFacts, change: BookingChange): Mail {
	const subject =
		change === 'booked'
			? `Your floor install is booked — ${f.storeName}`
			: change === 'moved'
				? `New dates for your floor install — ${f.storeName}`
				: `Your floor install dates are cancelled — ${f.storeName}`;
	const paragraphs =
		change === 'cancelled'
			? [
					`Hello ${f.customerName},`,
					`${f.storeName} has cancelled the install days ${dates(f.booking)}. The store will be in touch about new dates.`
				]
			: [
					`Hello ${f.customerName},`,
					`${f.storeName} will install your floor on ${dates(f.booking)}.`,
					arrival(f.booking),
					'Please clear the rooms of small items and make sure the installer can get in.'
				];
	return mail(to, f.storeName, subject, subject, paragraphs, calendarFor(f, change, 'customer'));
}
