import { formatDate, formatDateTime, zoneName } from '../../format';

/** One e-mail ready to send: what the mailer and the outbox both understand. */
export interface Mail {
	to: string;
	subject: string;
	html: string;
	text: string;
	/** Display name on the From line: the store's name on anything a store sends. */
	fromName?: string;
	replyTo?: string;
	/** Files sent with it (a calendar file); `content` is the file's text. */
	attachments?: MailAttachment[];
}

/** A small text file sent with an e-mail. */
export interface MailAttachment {
	filename: string;
	contentType: string;
	content: string;
}

const escapes: Record<string, string> = {
	'&': '&amp;',
	'<': '&lt;',
	'>': '&gt;',
	'"': '&quot;',
	"'": '&#39;'
};

/** Escapes text for HTML e-mail bodies. */
export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (c) => escapes[c]);
}

/** A store's letterhead on a customer's e-mail: its name, and its logo when it has one. */
export interface MailBrand {
	storeName: string;
	/** The logo as the customer's link serves it (`<link>/logo`); none when the store has none. */
	logoUrl?: string;
}

/** Amounts set out as on the customer's page: label and amount per row. */
export type MailFigures = [label: string, amount: string][];

/** A plain, readable e-mail layout: the store's letterhead, a heading, paragraphs and one button. */
function layout(options: {
	heading: string;
	paragraphs: string[];
	action: { label: string; url: string };
	footer: string;
	brand?: MailBrand;
	figures?: MailFigures;
	/** "What happens next", as on the customer's page. */
	next?: string;
}): { html: string; text: string } {
	const { heading, paragraphs, action, footer, brand, figures, next } = options;
	const letterhead = brand
		? `<p style="margin:0 0 24px;font-size:18px;font-weight:800">${
				brand.logoUrl
					? `<img src="${escapeHtml(brand.logoUrl)}" alt="${escapeHtml(brand.storeName)}" style="display:block;max-height:56px;max-width:200px;margin:0 0 8px">`
					: ''
			}${escapeHtml(brand.storeName)}</p>`
		: '';
	const table = figures?.length
		? `<table role="presentation" style="border-collapse:collapse;margin:0 0 16px;font-size:16px">${figures
				.map(
					([label, amount]) =>
						`<tr><td style="padding:4px 24px 4px 0;color:#566879">${escapeHtml(label)}</td><td style="padding:4px 0;font-weight:700;text-align:right">${escapeHtml(amount)}</td></tr>`
				)
				.join('')}</table>`
		: '';
	const nextHtml = next
		? `<h2 style="font-size:17px;margin:20px 0 8px">What happens next</h2><p style="font-size:16px;line-height:1.55;margin:0 0 14px">${escapeHtml(next)}</p>`
		: '';
	const html = `<!doctype html><html><body style="margin:0;background:#faf8f4;font-family:Manrope,Segoe UI,Helvetica,Arial,sans-serif;color:#26323d">
<div style="max-width:560px;margin:0 auto;padding:32px 24px">
${letterhead}<h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(heading)}</h1>
${paragraphs.map((p) => `<p style="font-size:16px;line-height:1.55;margin:0 0 14px">${escapeHtml(p)}</p>`).join('\n')}
${table}${nextHtml}
<p style="margin:24px 0"><a href="${escapeHtml(action.url)}" style="display:inline-block;background:#a9652c;color:#fff;text-decoration:none;font-weight:700;padding:12px 20px;border-radius:8px">${escapeHtml(action.label)}</a></p>
<p style="font-size:13px;color:#566879;margin:0 0 6px">Or open this address: ${escapeHtml(action.url)}</p>
<p style="font-size:13px;color:#566879;margin:24px 0 0">${escapeHtml(footer)}</p>
</div></body></html>`;
	const text = [
		...(brand ? [brand.storeName, ''] : []),
		heading,
		'',
		...paragraphs,
		...(figures?.length ? ['', ...figures.map(([label, amount]) => `${label}: ${amount}`)] : []),
		...(next ? ['', 'What happens next', next] : []),
		'',
		`${action.label}: ${action.url}`,
		'',
		footer
	].join('\n');
	return { html, text };
}

/** The invitation a store owner sends to a new member. */
export function invitationMail(input: {
	to: string;
	storeName: string;
	inviterName: string;
	roleLabel: string;
	url: string;
	expiresAt: Date;
	/** The store's time zone. */
	timeZone: string;
}): Mail {
	const expires = formatDate(input.expiresAt, input.timeZone, 'long');
	return {
		to: input.to,
		fromName: input.storeName,
		subject: `${input.inviterName} invited you to ${input.storeName}`,
		...layout({
			heading: `Join ${input.storeName}`,
			paragraphs: [
				`${input.inviterName} has invited you to work with ${input.storeName} as ${input.roleLabel}.`,
				`Open the invitation to create your login, or sign in if you already have one. The invitation is good until ${expires}.`
			],
			action: { label: 'Open the invitation', url: input.url },
			footer: `If you did not expect this, you can ignore this e-mail.`
		})
	};
}

/** A password reset link. */
export function passwordResetMail(input: { to: string; name: string; url: string }): Mail {
	return {
		to: input.to,
		subject: 'Reset your password',
		...layout({
			heading: 'Reset your password',
			paragraphs: [
				`Hello ${input.name},`,
				'Someone asked to reset the password for this e-mail address. The link works once, for one hour.'
			],
			action: { label: 'Choose a new password', url: input.url },
			footer: 'If you did not ask for this, ignore this e-mail: your password stays as it is.'
		})
	};
}

/** The quote, from the store, with the customer's link. */
export function quoteMail(input: {
	to: string;
	storeName: string;
	storePhone: string;
	customerName: string;
	jobTitle: string;
	total: string;
	deposit: string;
	validUntil: Date;
	url: string;
	replyTo?: string;
	/** The store's time zone. */
	timeZone: string;
	logoUrl?: string;
	/** The store's "What happens next", as on the quote's page. */
	nextSteps?: string;
}): Mail {
	const until = formatDate(input.validUntil, input.timeZone, 'long');
	return {
		to: input.to,
		fromName: input.storeName,
		replyTo: input.replyTo || undefined,
		subject: `Your quote from ${input.storeName}: ${input.jobTitle}`,
		...layout({
			brand: { storeName: input.storeName, logoUrl: input.logoUrl },
			figures: [
				['Total', input.total],
				['Deposit to book the install', input.deposit]
			],
			next: input.nextSteps,
			heading: `Your quote: ${input.jobTitle}`,
			paragraphs: [
				`Hello ${input.customerName},`,
				`Here is your quote from ${input.storeName}: ${input.total} in all, with a deposit of ${input.deposit} to book the install.`,
				`Open it to see each room drawn to scale, what the floor needs before the new one goes down, and what it costs. You can accept it there by typing your name, or ask us for changes. It is good until ${until}.`,
				input.storePhone ? `Questions? Call us on ${input.storePhone}.` : ''
			].filter(Boolean),
			action: { label: 'Open your quote', url: input.url },
			footer: `Sent by ${input.storeName}. This link is for you: please do not forward it.`
		})
	};
}

/** Tells the salesperson what the customer did with the quote. */
export function customerAnswerMail(input: {
	to: string;
	storeName: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	answer: 'accepted' | 'changes';
	note?: string;
	url: string;
}): Mail {
	const accepted = input.answer === 'accepted';
	return {
		to: input.to,
		fromName: input.storeName,
		subject: accepted
			? `${input.customerName} accepted the quote for ${input.jobLabel}`
			: `${input.customerName} asked for changes to ${input.jobLabel}`,
		...layout({
			heading: accepted ? 'Quote accepted' : 'Changes asked for',
			paragraphs: [
				accepted
					? `${input.customerName} accepted the quote for ${input.jobLabel} ${input.jobTitle}. The job is ready for the deposit.`
					: `${input.customerName} asked for changes to the quote for ${input.jobLabel} ${input.jobTitle}:`,
				...(input.note ? [`“${input.note}”`] : [])
			],
			action: { label: 'Open the job', url: input.url },
			footer: `${input.storeName} · Flushline`
		})
	};
}

/** What the customer's money e-mails (a receipt, a refund) say of the store, the job and the money. */
export interface MoneyMailInput {
	to: string;
	storeName: string;
	storePhone: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	amount: string;
	/** Paid so far, less refunds: the page's "Paid so far". */
	paidSoFar: string;
	/** Still to pay: the page's "Still to pay". */
	balance: string;
	reference: string;
	url: string;
	/** The store's time zone. */
	timeZone: string;
	logoUrl?: string;
	/** What happens next now (`$lib/papers/next`), when something does. */
	next?: string;
}

function moneyMail(
	input: MoneyMailInput,
	at: Date,
	parts: {
		subject: string;
		heading: string;
		happened: (when: string) => string;
		/** The amount's label in the figures ("Received", "Refunded"). */
		figure: string;
		note?: string;
		footer: string;
	}
): Mail {
	const when = `${formatDateTime(at, input.timeZone, 'long')} ${zoneName(at, input.timeZone)}`;
	return {
		to: input.to,
		fromName: input.storeName,
		subject: `${parts.subject} from ${input.storeName}: ${input.amount} for ${input.jobTitle}`,
		...layout({
			brand: { storeName: input.storeName, logoUrl: input.logoUrl },
			heading: parts.heading,
			paragraphs: [
				parts.happened(when),
				parts.note ?? '',
				input.storePhone ? `Questions? Call us on ${input.storePhone}.` : ''
			].filter(Boolean),
			figures: [
				[parts.figure, input.amount],
				['Paid so far', input.paidSoFar],
				['Still to pay', input.balance],
				['Reference', input.reference]
			],
			next: input.next,
			action: { label: 'See your job', url: input.url },
			footer: parts.footer
		})
	};
}

/** The customer's receipt for a payment, from the store. */
export function receiptMail(input: MoneyMailInput & { what: string; paidAt: Date }): Mail {
	return moneyMail(input, input.paidAt, {
		subject: 'Receipt',
		heading: `Thank you, ${input.customerName}`,
		happened: (when) =>
			`${input.storeName} received ${input.amount} (${input.what}) for ${input.jobLabel} ${input.jobTitle} on ${when}.`,
		figure: 'Received',
		footer: `Keep this e-mail as your receipt. Sent by ${input.storeName}.`
	});
}

/** Tells the customer money was given back, why, and where their job's money now stands. */
export function refundMail(
	input: MoneyMailInput & {
		/** Why, in the customer's words. */
		why: string;
		/** Where it goes: "to the card you paid with". */
		where: string;
		refundedAt: Date;
	}
): Mail {
	return moneyMail(input, input.refundedAt, {
		subject: 'Refund',
		heading: `${input.customerName}, we have refunded ${input.amount}`,
		happened: (when) =>
			`${input.storeName} refunded ${input.amount} for ${input.jobLabel} ${input.jobTitle} on ${when}, for ${input.why}, ${input.where}.`,
		figure: 'Refunded',
		note: 'A card refund can take several business days to show on your statement.',
		footer: `Keep this e-mail for your records. Sent by ${input.storeName}.`
	});
}

/** Tells the salesperson the customer paid. */
export function paidNoticeMail(input: {
	to: string;
	storeName: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	what: string;
	amount: string;
	url: string;
}): Mail {
	return {
		to: input.to,
		fromName: input.storeName,
		subject: `${input.customerName} paid the ${input.what} for ${input.jobLabel}`,
		...layout({
			heading: `${input.what[0].toUpperCase()}${input.what.slice(1)} paid`,
			paragraphs: [
				`${input.customerName} paid ${input.amount} (${input.what}) for ${input.jobLabel} ${input.jobTitle}.`
			],
			action: { label: 'Open the job', url: input.url },
			footer: `${input.storeName} · Flushline`
		})
	};
}

/** A change order sent to the customer: what was found, its price, and the link to decide. */
export function changeOrderMail(input: {
	to: string;
	storeName: string;
	storePhone: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	changeLabel: string;
	/** The signed total: positive to pay, negative for a credit. */
	totalCents: number;
	total: string;
	url: string;
	replyTo?: string;
	logoUrl?: string;
	/** The items found, in the words the customer's page uses, with their amounts. */
	items?: MailFigures;
}): Mail {
	const credit = input.totalCents < 0;
	return {
		to: input.to,
		fromName: input.storeName,
		replyTo: input.replyTo || undefined,
		subject: `${input.changeLabel} for ${input.jobTitle}: your approval, please`,
		...layout({
			brand: { storeName: input.storeName, logoUrl: input.logoUrl },
			heading: `${input.changeLabel}: what we found on site`,
			paragraphs: [
				`Hello ${input.customerName},`,
				`While working on ${input.jobLabel} ${input.jobTitle}, our installer found the subfloor needed different preparation from what was quoted. We have priced the difference from the same price list as your quote.`,
				credit
					? `It comes to a credit of ${input.total}, taken off what you owe once you approve it.`
					: `It comes to ${input.total}. Open it to see the photos and each item, then approve it by typing your name, or decline it.`,
				input.storePhone ? `Questions? Call us on ${input.storePhone}.` : ''
			].filter(Boolean),
			figures: input.items?.length
				? [...input.items, [credit ? 'Credit' : 'Total', input.total]]
				: undefined,
			next: credit
				? 'Once you approve it, the credit comes off the balance you pay when the work is finished.'
				: 'Once you approve it, the installer carries on with this work and the amount is added to what you owe: pay it on your page now, or with the balance when the work is finished. If you decline it, tell us why on the same page and we will be in touch about how to go on.',
			action: { label: 'See the change order', url: input.url },
			footer: `Sent by ${input.storeName}. This link is for you: please do not forward it.`
		})
	};
}

/** The job is done: what is still owed, and the link to sign off and pay it. */
export function balanceMail(input: {
	to: string;
	storeName: string;
	storePhone: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	balance: string;
	url: string;
	replyTo?: string;
}): Mail {
	return {
		to: input.to,
		fromName: input.storeName,
		replyTo: input.replyTo || undefined,
		subject: `${input.jobTitle} is finished: ${input.balance} to pay`,
		...layout({
			heading: `Your new floor is down`,
			paragraphs: [
				`Hello ${input.customerName},`,
				`We have finished ${input.jobLabel} ${input.jobTitle}. Open your page to see the photos and the walk-through notes, and sign off the work.`,
				`The balance still to pay is ${input.balance} (your quote and any change orders you approved, less what you have paid). You can pay it by card on the same page.`,
				input.storePhone ? `Questions? Call us on ${input.storePhone}.` : ''
			].filter(Boolean),
			action: { label: 'Sign off and pay', url: input.url },
			footer: `Sent by ${input.storeName}. This link is for you: please do not forward it.`
		})
	};
}

/** Tells the manager who sent a change order what the customer did with it. */
export function changeOrderAnswerMail(input: {
	to: string;
	storeName: string;
	customerName: string;
	jobLabel: string;
	jobTitle: string;
	changeLabel: string;
	answer: 'approved' | 'declined';
	reason?: string;
	url: string;
}): Mail {
	const approved = input.answer === 'approved';
	return {
		to: input.to,
		fromName: input.storeName,
		subject: `${input.customerName} ${input.answer} ${input.changeLabel} for ${input.jobLabel}`,
		...layout({
			heading: approved ? 'Change order approved' : 'Change order declined',
			paragraphs: [
				`${input.customerName} ${input.answer} ${input.changeLabel} for ${input.jobLabel} ${input.jobTitle}.`,
				...(input.reason ? [`“${input.reason}”`] : [])
			],
			action: { label: 'Open the change order', url: input.url },
			footer: `${input.storeName} · Flushline`
		})
	};
}
