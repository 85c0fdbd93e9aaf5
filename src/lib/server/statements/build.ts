import { jobLabel } from '$lib/jobs/status';
import { installPay, manualLineAmount, type ManualLineKind } from '$lib/statements/maths';
import * as quotes from '../db/queries/quotes';
import * as installers from '../db/queries/installers';
import * as settings from '../db/queries/settings';
import * as statements from '../db/queries/statements';
import type { StoreWriteTx } from '../db/tenant';
import { log } from '../log';

export type StatementResult =
	| { ok: true; statementId: string; added: number }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'refused'; field?: string; message: string };

const refused = (message: string, field?: string): StatementResult => ({
	ok: false,
	reason: 'refused',
	message,
	field
});

const FROZEN =
	'This statement is paid and kept as it is: put a correction on the next period’s statement.';

/**
 * Adds to an open statement what its installer earned in its period and no statement has yet:
 * an `install` line per job of theirs completed in the period (the pay of its accepted quote,
 * with their own rates in place of the book's), an `extra` line per change order the customer
 * approved in the period on their jobs. Returns how many lines were added.
 */
export async function collectLines(
	tx: StoreWriteTx,
	statement: statements.Statement,
	actorId: string,
	timeZone: string
): Promise<number> {
	const period = { start: statement.periodStart, end: statement.periodEnd };
	const who = await installers.read(tx, statement.installerId);
	const rates = who?.profile?.payRates ?? [];
	let added = 0;
	for (const done of await statements.completedUnpaid(
		tx,
		statement.installerId,
		period,
		timeZone
	)) {
		const q = await quotes.accepted(tx, done.jobId);
		if (!q) {
			log.warn({ jobId: done.jobId }, 'A completed job has no accepted quote to pay from');
			continue;
		}
		const pay = installPay(q.result, rates);
		await statements.insertLine(
			tx,
			{
				statementId: statement.id,
				installerId: statement.installerId,
				kind: 'install',
				jobId: done.jobId,
				description: `${jobLabel(done.number)} ${done.title}`,
				amountCents: pay.totalCents
			},
			actorId
		);
		added += 1;
	}
	for (const co of await statements.approvedExtrasUnpaid(
		tx,
		statement.installerId,
		period,
		timeZone
	)) {
		await statements.insertLine(
			tx,
			{
				statementId: statement.id,
				installerId: statement.installerId,
				kind: 'extra',
				jobId: co.jobId,
				changeOrderId: co.changeOrderId,
				description: `CO-${co.number} on ${jobLabel(co.jobNumber)}`,
				amountCents: co.payDeltaCents
			},
			actorId
		);
		added += 1;
	}
	return added;
}

/** Makes a statement for one installer and period, with the lines the period earned. */
export async function makeStatement(
	tx: StoreWriteTx,
	input: { installerId: string; periodStart: string; periodEnd: string },
	actor: { id: string; timeZone: string }
): Promise<StatementResult> {
	if (!(await installers.isInstaller(tx, input.installerId)))
		return refused('Choose one of the store’s installers.', 'installerId');
	await installers.ensureProfiles(tx, input.installerId);
	const existing = await statements.list(tx, { installerId: input.installerId });
	if (existing.some((s) => s.periodStart === input.periodStart))
		return refused('This installer already has a statement starting that day.', 'periodStart');
	const { currency } = await settings.termsOf(tx);
	const row = await statements.insert(tx, { ...input, currency });
	if (!row)
		return refused('This installer already has a statement starting that day.', 'periodStart');
	const added = await collectLines(tx, row, actor.id, actor.timeZone);
	return { ok: true, statementId: row.id, added };
}

/** Brings into an open statement the work finished in its period since it was made. */
export async function refreshStatement(
	tx: StoreWriteTx,
	id: string,
	actor: { id: string; timeZone: string }
): Promise<StatementResult> {
	const row = await statements.lock(tx, id);
	if (!row) return { ok: false, reason: 'not_found' };
	if (row.status === 'paid') return refused(FROZEN);
	const added = await collectLines(tx, row, actor.id, actor.timeZone);
	return { ok: true, statementId: id, added };
}

/** A manager's chargeback (always taken off) or adjustment, with its reason. */
export async function addManualLine(
	tx: StoreWriteTx,
	id: string,
	input: { kind: ManualLineKind; amountCents: number; reason: string; description: string },
	actorId: string
): Promise<StatementResult> {
	const row = await statements.lock(tx, id);
	if (!row) return { ok: false, reason: 'not_found' };
	if (row.status === 'paid') return refused(FROZEN);
	const amount = manualLineAmount(input.kind, input.amountCents);
	if (!amount.ok) return refused(amount.message, 'amount');
	await statements.insertLine(
		tx,
		{
			statementId: id,
			installerId: row.installerId,
			kind: input.kind,
			description: input.description,
			reason: input.reason,
			amountCents: amount.amountCents
		},
		actorId
	);
	return { ok: true, statementId: id, added: 1 };
}

/** Marks an open statement paid with the store's reference; from then on it is frozen. */
export async function payStatement(
	tx: StoreWriteTx,
	id: string,
	reference: string,
	actorId: string
): Promise<StatementResult> {
	const row = await statements.lock(tx, id);
	if (!row) return { ok: false, reason: 'not_found' };
	if (row.status === 'paid') return refused('This statement is already paid.');
	await statements.markPaid(tx, id, reference, actorId);
	return { ok: true, statementId: id, added: 0 };
}
